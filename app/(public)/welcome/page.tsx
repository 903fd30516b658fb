import { redirect } from 'next/navigation';
import { requirePageUser } from '@/lib/auth/guard';
import { homeFor } from '@/lib/auth/home';

// Lands a freshly signed-in user on their role's home.
export default async function WelcomePage() {
  const user = await requirePageUser(undefined, '/welcome');
  redirect(homeFor(user.role));
}
