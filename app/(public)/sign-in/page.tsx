import Link from 'next/link';
import { redirect } from 'next/navigation';
import { EmailLinkForm, PasswordSignInForm } from '@/components/auth/SignInForms';
import { Card } from '@/components/ui/Card';
import { Notice } from '@/components/ui/Notice';
import { currentUser } from '@/lib/auth/guard';
import { homeFor } from '@/lib/auth/home';
import { isDemo } from '@/lib/env';
import { DEMO_ACCOUNTS } from '@/lib/demo';

export const metadata = { title: 'Sign in' };

const ERRORS: Record<string, string> = {
  Verification: 'That sign-in link has already been used or has expired. Ask for a new one below.',
  EmailSignin: 'We could not send the sign-in e-mail. Try again in a moment.',
  CredentialsSignin: 'That e-mail and password do not match an account.',
  TooManyAttempts: 'Too many sign-in attempts. Please wait a few minutes and try again.',
};

function safeCallback(raw: string | undefined): string | null {
  return raw && raw.startsWith('/') && !raw.startsWith('//') ? raw : null;
}

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ callbackUrl?: string; error?: string }> }) {
  const { callbackUrl, error } = await searchParams;
  const user = await currentUser();
  if (user) redirect(safeCallback(callbackUrl) ?? homeFor(user.role));
  const target = safeCallback(callbackUrl) ?? '/welcome';
  return (
    <div className="mx-auto grid max-w-3xl gap-6 md:grid-cols-2">
      <div className="md:col-span-2">
        <h1 className="text-3xl font-bold">Sign in</h1>
        <p className="text-ink-500">
          New here? <Link href="/join">Create an account</Link>.
        </p>
      </div>
      {error && (
        <div className="md:col-span-2">
          <Notice tone="danger">{ERRORS[error] ?? 'Sign-in did not work. Please try again.'}</Notice>
        </div>
      )}
      <Card>
        <h2 className="mb-4 text-lg font-bold">With your password</h2>
        <PasswordSignInForm callbackUrl={target} />
      </Card>
      <Card>
        <h2 className="mb-4 text-lg font-bold">With a link by e-mail</h2>
        <EmailLinkForm callbackUrl={target} />
        <p className="mt-3 text-xs text-ink-500">The link works once and expires in 24 hours.</p>
      </Card>
      {isDemo && (
        <div className="md:col-span-2">
          <Notice title="Demo accounts (invented people, demo data only)">
            <ul className="mt-1 space-y-0.5">
              {DEMO_ACCOUNTS.map((a) => (
                <li key={a.email}>
                  {a.label}: <code>{a.email}</code> / <code>{a.password}</code>
                </li>
              ))}
            </ul>
            <p className="mt-1">E-mailed links arrive in the demo mailbox, which the admin account can read.</p>
          </Notice>
        </div>
      )}
    </div>
  );
}
