import 'server-only';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import EmailProvider from 'next-auth/providers/email';
import { db } from '@/lib/db';
import { env } from '@/lib/env';
import { sendMail } from '@/lib/mail/transport';
import { signInLinkMail } from '@/lib/mail/templates';
import { knexAuthAdapter } from './adapter';
import { verifyCredentials } from './accounts';
import { signInSchema } from './schema';

const SESSION_MAX_AGE_SECONDS = 30 * 24 * 60 * 60;
const secureCookies = env.APP_URL.startsWith('https://');

export const authOptions: NextAuthOptions = {
  secret: env.AUTH_SECRET,
  adapter: knexAuthAdapter(db),
  session: { strategy: 'jwt', maxAge: SESSION_MAX_AGE_SECONDS },
  useSecureCookies: secureCookies,
  cookies: {
    sessionToken: {
      name: secureCookies ? '__Secure-lacewright.session' : 'lacewright.session',
      options: { httpOnly: true, sameSite: 'lax', path: '/', secure: secureCookies },
    },
  },
  pages: { signIn: '/sign-in', verifyRequest: '/sign-in/check-email', error: '/sign-in' },
  providers: [
    CredentialsProvider({
      id: 'password',
      name: 'E-mail and password',
      credentials: { email: { label: 'E-mail', type: 'email' }, password: { label: 'Password', type: 'password' } },
      async authorize(raw) {
        const parsed = signInSchema.safeParse(raw);
        if (!parsed.success) return null;
        const user = await verifyCredentials(db, parsed.data.email, parsed.data.password);
        return user ? { id: user.id, email: user.email, name: user.name } : null;
      },
    }),
    EmailProvider({
      from: env.MAIL_FROM,
      maxAge: 24 * 60 * 60,
      server: { host: env.SMTP_HOST, port: env.SMTP_PORT },
      async sendVerificationRequest({ identifier, url }) {
        await sendMail(signInLinkMail(identifier, url));
      },
    }),
  ],
  callbacks: {
    // The token carries only the user id; role and shop are read fresh on every request by the guard.
    async jwt({ token, user }) {
      if (user) token.sub = user.id;
      return token;
    },
    async session({ session, token }) {
      if (session.user && token.sub) (session.user as { id?: string }).id = token.sub;
      return session;
    },
  },
};
