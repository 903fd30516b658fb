import 'server-only';
import { db } from '@/lib/db';
import type { PaymentsContext } from './context';
import { contextFor } from './envContext';

/** The app's payments context: the one Knex instance, the processor client and the settings. */
export function paymentsContext(): PaymentsContext {
  return contextFor(db);
}
