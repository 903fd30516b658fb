'use client';

import { Button } from '@/components/ui/Button';

export default function ErrorPage({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div className="mx-auto max-w-lg py-16 text-center" role="alert">
      <p className="font-display text-3xl font-bold text-rust-700">Something slipped a spoke</p>
      <p className="mt-3 text-ink-500">This page hit a problem on our side. Nothing you entered was sent twice. Try again in a moment.</p>
      <div className="mt-6">
        <Button onClick={reset}>Try again</Button>
      </div>
    </div>
  );
}
