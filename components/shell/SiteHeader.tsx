import Link from 'next/link';
import { currentUser } from '@/lib/auth/guard';
import { buttonClass } from '@/components/ui/Button';
import { NameMark } from './NameMark';
import { NAV_BY_ROLE } from './navigation';
import { SignOutButton } from './SignOutButton';

const ROLE_LABEL = { rider: 'Rider', builder: 'Builder', admin: 'Admin' } as const;

export async function SiteHeader() {
  const user = await currentUser().catch(() => null);
  const items = NAV_BY_ROLE[user?.role ?? 'visitor'];
  return (
    <header className="border-b border-chalk-200 bg-white">
      <div className="mx-auto flex max-w-page flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
        <NameMark />
        <nav aria-label="Main" className="order-3 w-full sm:order-none sm:w-auto sm:flex-1">
          <ul className="flex flex-wrap gap-1" data-testid="main-nav">
            {items.map((item) => (
              <li key={item.href}>
                <Link href={item.href} className="rounded px-3 py-1.5 text-sm font-semibold text-ink-700 no-underline hover:bg-chalk-100 hover:no-underline">
                  {item.label}
                </Link>
              </li>
            ))}
          </ul>
        </nav>
        <div className="ml-auto flex items-center gap-2">
          {user ? (
            <>
              <span className="hidden text-sm text-ink-500 md:inline" data-testid="signed-in-as">
                {user.name} · <span className="font-semibold text-brass-700">{ROLE_LABEL[user.role]}</span>
              </span>
              <SignOutButton />
            </>
          ) : (
            <>
              <Link href="/sign-in" className="rounded px-3 py-1.5 text-sm font-semibold text-ink-700 no-underline hover:bg-chalk-100 hover:no-underline">
                Sign in
              </Link>
              <Link href="/join" className={buttonClass('primary')}>
                Join
              </Link>
            </>
          )}
        </div>
      </div>
    </header>
  );
}
