import type { Knex } from 'knex';
import type { Adapter, AdapterAccount, AdapterUser } from 'next-auth/adapters';

// The part of next-auth's adapter contract that e-mail sign-in links use, over our own tables.
// Sessions are JWTs, so no session table is needed.
function toAdapterUser(row: { id: string; email: string; name: string; email_verified_at: Date | null }): AdapterUser {
  return { id: row.id, email: row.email, name: row.name, emailVerified: row.email_verified_at };
}

const USER_COLUMNS = ['id', 'email', 'name', 'email_verified_at'];

export function knexAuthAdapter(db: Knex): Adapter {
  return {
    async createUser(user: Omit<AdapterUser, 'id'>) {
      // Someone who signs in by link without an account becomes a rider with no password.
      const email = user.email.toLowerCase();
      const [row] = await db('users')
        .insert({ email, name: user.name ?? email.split('@')[0], role: 'rider', email_verified_at: user.emailVerified })
        .returning(USER_COLUMNS);
      return toAdapterUser(row);
    },
    async getUser(id) {
      const row = await db('users').where({ id }).first(USER_COLUMNS);
      return row ? toAdapterUser(row) : null;
    },
    async getUserByEmail(email) {
      const row = await db('users').where({ email: email.toLowerCase() }).first(USER_COLUMNS);
      return row ? toAdapterUser(row) : null;
    },
    async getUserByAccount({ provider, providerAccountId }) {
      const row = await db('users as u')
        .join('auth_accounts as a', 'a.user_id', 'u.id')
        .where({ 'a.provider': provider, 'a.provider_account_id': providerAccountId })
        .first(USER_COLUMNS.map((c) => `u.${c}`));
      return row ? toAdapterUser(row) : null;
    },
    async updateUser(user) {
      const patch: Record<string, unknown> = { updated_at: db.fn.now() };
      if (user.name) patch.name = user.name;
      if (user.emailVerified !== undefined) patch.email_verified_at = user.emailVerified;
      const [row] = await db('users').where({ id: user.id }).update(patch).returning(USER_COLUMNS);
      return toAdapterUser(row);
    },
    async linkAccount(account: AdapterAccount) {
      await db('auth_accounts')
        .insert({ user_id: account.userId, type: account.type, provider: account.provider, provider_account_id: account.providerAccountId })
        .onConflict(['provider', 'provider_account_id'])
        .ignore();
    },
    async createVerificationToken(token) {
      await db('verification_tokens').insert({ identifier: token.identifier, token: token.token, expires: token.expires });
      return token;
    },
    async useVerificationToken({ identifier, token }) {
      // Delete-returning makes the link single-use even when two clicks race.
      const [row] = await db('verification_tokens').where({ identifier, token }).del().returning(['identifier', 'token', 'expires']);
      return row ?? null;
    },
  };
}
