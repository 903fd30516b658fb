import type { Role } from '@/lib/auth/roles';

export interface NavItem {
  href: string;
  label: string;
}

// What each kind of visitor sees in the top bar.
export const NAV_BY_ROLE: Record<Role | 'visitor', NavItem[]> = {
  visitor: [
    { href: '/fit', label: 'Fit check' },
    { href: '/builders', label: 'Find a builder' },
  ],
  rider: [
    { href: '/requests', label: 'My wheel requests' },
    { href: '/requests/new', label: 'Ask for a build' },
    { href: '/jobs', label: 'My builds' },
    { href: '/fit', label: 'Fit check' },
    { href: '/builders', label: 'Find a builder' },
  ],
  builder: [
    { href: '/board', label: 'Open requests' },
    { href: '/bids', label: 'My bids' },
    { href: '/jobs', label: 'Jobs' },
    { href: '/payouts', label: 'Payouts' },
    { href: '/shop/settings', label: 'Shop settings' },
    { href: '/fit', label: 'Fit check' },
  ],
  admin: [
    { href: '/admin', label: 'Overview' },
    { href: '/admin/disputes', label: 'Disputes' },
    { href: '/admin/ledger', label: 'Ledger' },
    { href: '/admin/audit', label: 'Audit log' },
    { href: '/admin/mailbox', label: 'Demo mailbox' },
    { href: '/builders', label: 'Builders' },
  ],
};
