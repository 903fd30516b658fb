import { db } from '@/lib/db';
import { route, withStatus } from '@/lib/http/route';
import { inviteShopToBid } from '@/lib/matching/invitations';
import { invitationInputSchema, type InvitationInput } from '@/lib/matching/schema';

// A rider invites this shop to bid on one of their open requests; a repeat sends nothing and says so.
export const POST = route<InvitationInput, { slug: string }>({ access: { roles: ['rider'] }, body: invitationInputSchema }, async ({ user, params, body }) => {
  const result = await inviteShopToBid(db, user!, params.slug, body.requestId);
  return withStatus(result.invitedNow ? 201 : 200, result);
});
