import Link from 'next/link';
import { JoinForm } from '@/components/auth/JoinForm';
import { Card } from '@/components/ui/Card';

export const metadata = { title: 'Join' };

export default function JoinPage() {
  return (
    <div className="mx-auto max-w-xl">
      <h1 className="text-3xl font-bold">Join Lacewright</h1>
      <p className="mb-6 text-ink-500">
        Already have an account? <Link href="/sign-in">Sign in</Link>.
      </p>
      <Card>
        <JoinForm />
      </Card>
    </div>
  );
}
