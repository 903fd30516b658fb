import { ButtonLink } from '@/components/ui/Button';
import { Card } from '@/components/ui/Card';

export default function RequestNotFound() {
  return (
    <Card className="text-center">
      <h1 className="text-2xl font-bold">This request is not open to your shop</h1>
      <p className="mt-2 text-ink-500">It may have been taken down, awarded to another shop, or the link may be wrong.</p>
      <div className="mt-4">
        <ButtonLink href="/board">Back to open requests</ButtonLink>
      </div>
    </Card>
  );
}
