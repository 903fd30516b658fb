import type { Role } from './roles';

/** Where each role lands after signing in. */
export function homeFor(role: Role): string {
  return { rider: '/requests', builder: '/board', admin: '/admin' }[role];
}
