import { Card } from '@/components/ui/Card';

export const metadata = { title: 'Check your e-mail' };

export default function CheckEmailPage() {
  return (
    <Card className="mx-auto max-w-md text-center">
      <h1 className="text-2xl font-bold">Check your e-mail</h1>
      <p className="mt-2 text-ink-500">We sent a sign-in link. It works once and expires in 24 hours. You can close this tab.</p>
    </Card>
  );
}
