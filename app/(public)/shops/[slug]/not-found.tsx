import { ButtonLink } from '@/components/ui/Button';
import { Card } from '@/components/ui/Card';

export default function ShopNotFound() {
  return (
    <Card className="text-center">
      <h1 className="text-2xl font-bold">We could not find that shop</h1>
      <p className="mt-2 text-ink-500">The link may be wrong, or the shop may have changed its name.</p>
      <div className="mt-4">
        <ButtonLink href="/builders">Find a builder</ButtonLink>
      </div>
    </Card>
  );
}
