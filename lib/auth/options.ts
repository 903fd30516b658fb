import 'server-only';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import EmailProvider from 'next-auth/providers/email';
import { db } from '@/lib/db';
import { env } from '@/lib/env';
import { sendMail } from '@/lib/mail/transport';
import { signInLinkMail } from '@/lib/mail/templates';
import { clientAddress } from '@/lib/security/clientAddress';
import { recordSignInFailure, recordSignInSuccess, signInStanding } from '@/lib/security/limits';
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
      async authorize(raw, req) {
        const parsed = signInSchema.safeParse(raw);
        if (!parsed.success) return null;
        // Failed tries are counted per account and per address; proxy.ts answers 429 once either is used
        // up, and this check holds the line should a request reach here another way.
        const address = clientAddress(req?.headers ?? {});
        if (!(await signInStanding(parsed.data.email, address)).allowed) throw new Error('TooManyAttempts');
        const user = await verifyCredentials(db, parsed.data.email, parsed.data.password);
        if (!user) {
          await recordSignInFailure(parsed.data.email, address);
          return null;
        }
        await recordSignInSuccess(parsed.data.email);
        return { id: user.id, email: user.email, name: user.name };
      },
    }),
    EmailProvider({
      from: env.MAIL_FROM,
      maxAge: 24 * 60 * 60,
      server: { host: env.SMTP_HOST, port: env.SMTP_PORT },
      async sendVerificationRequest({ identifier, url }) {
        // Links asked for are counted per mailbox and per address in proxy.ts, which answers 429 when used up.
        await sendMail(signInLinkMail(identifier, url));
      },
    }),
  ],
  callbacks: {
    // Only our own pages: a relative path or a URL on this site; anything else (or nothing parseable) goes home.
    async redirect({ url, baseUrl }) {
      if (url.startsWith('/') && !url.startsWith('//')) return `${baseUrl}${url}`;
      try {
        if (new URL(url).origin === new URL(baseUrl).origin) return url;
      } catch {
        /* not a URL */
      }
      return baseUrl;
    },
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
