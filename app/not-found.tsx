import { ButtonLink } from '@/components/ui/Button';

export default function NotFound() {
  return (
    <div className="mx-auto max-w-lg py-16 text-center">
      <p className="font-display text-4xl font-bold text-petrol-600">Nothing laced here</p>
      <p className="mt-3 text-ink-500">We could not find that page. It may have moved, or the link may be mistyped.</p>
      <div className="mt-6">
        <ButtonLink href="/">Back to the start</ButtonLink>
      </div>
    </div>
  );
}
