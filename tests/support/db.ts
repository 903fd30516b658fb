import knex, { type Knex } from 'knex';
import { inject } from 'vitest';
import { knexConfig } from '../../knexfile';

/** A Knex instance on the throwaway test database; destroy it in afterAll. */
export function testDb(url = inject('databaseUrl')): Knex {
  return knex(knexConfig(url));
}

let counter = 0;
/** An e-mail address no other test uses. */
export function uniqueEmail(prefix = 'person'): string {
  counter += 1;
  return `${prefix}-${Date.now().toString(36)}-${process.pid}-${counter}@example.test`;
}
