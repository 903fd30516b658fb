'use client';

import { Button, ButtonLink } from '@/components/ui/Button';

export default function BuilderError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div className="mx-auto max-w-lg py-16 text-center" role="alert">
      <p className="font-display text-3xl font-bold text-rust-700">This page did not load</p>
      <p className="mt-3 text-ink-500">Something went wrong on our side. Your bids and messages are as you left them. Try again, or go back to the board.</p>
      <div className="mt-6 flex justify-center gap-3">
        <Button onClick={reset}>Try again</Button>
        <ButtonLink href="/board" tone="secondary">
          Open requests
        </ButtonLink>
      </div>
    </div>
  );
}
