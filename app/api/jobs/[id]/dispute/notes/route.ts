import { route } from '@/lib/http/route';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { addDisputeNote } from '@/lib/payments/disputes';
import { disputeNoteSchema } from '@/lib/payments/schema';

// Either side of the job, or an admin, adds to its open dispute's thread: { body }.
export const POST = route<{ body: string }, { id: string }>({ access: 'signed-in', body: disputeNoteSchema }, async ({ user, params, body }) =>
  addDisputeNote(paymentsContext(), user!, params.id, body.body),
);
