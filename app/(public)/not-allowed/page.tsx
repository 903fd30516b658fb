import { ButtonLink } from '@/components/ui/Button';

export const metadata = { title: 'Not for this account' };

export default function NotAllowedPage() {
  return (
    <div className="mx-auto max-w-lg py-16 text-center">
      <p className="font-display text-3xl font-bold text-ink-900">Not for this account</p>
      <p className="mt-3 text-ink-500">This page belongs to another kind of account. Sign in with the right one, or head back.</p>
      <div className="mt-6 flex justify-center gap-3">
        <ButtonLink href="/">Home</ButtonLink>
        <ButtonLink href="/sign-in" tone="secondary">
          Sign in as someone else
        </ButtonLink>
      </div>
    </div>
  );
}
