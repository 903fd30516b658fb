// Shapes the invite form and its route handler share.
import { z } from 'zod';

/** POST /api/shops/:slug/invitations */
export const invitationInputSchema = z.object({ requestId: z.uuid({ error: 'Choose one of your open requests.' }) });
export type InvitationInput = z.infer<typeof invitationInputSchema>;
