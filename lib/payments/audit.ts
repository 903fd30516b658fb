// The admin audit log: every admin action on money, who took it, when and why. Written in the same
// transaction as the action, so an action and its record stand or fall together.
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';

export type AuditAction = 'dispute.resolved' | 'dispute.note' | 'ledger.exported';

export async function writeAudit(
  db: Knex,
  admin: SessionUser,
  a: { action: AuditAction; targetType: 'dispute' | 'job' | 'ledger'; targetId?: string | null; reason?: string | null; details?: Record<string, unknown> },
): Promise<void> {
  await db('admin_audit_log').insert({
    admin_id: admin.id,
    admin_email: admin.email,
    action: a.action,
    target_type: a.targetType,
    target_id: a.targetId ?? null,
    reason: a.reason ?? null,
    details: JSON.stringify(a.details ?? {}),
  });
}

export interface AuditEntryView {
  id: string;
  at: string;
  adminEmail: string;
  action: string;
  targetType: string;
  targetId: string | null;
  reason: string | null;
  details: Record<string, unknown>;
}

export async function listAudit(db: Knex, opts: { limit?: number; beforeId?: string } = {}): Promise<AuditEntryView[]> {
  const q = db('admin_audit_log').orderBy('id', 'desc').limit(Math.min(opts.limit ?? 100, 500));
  if (opts.beforeId && /^\d+$/.test(opts.beforeId)) q.where('id', '<', opts.beforeId);
  const rows = (await q) as { id: string; created_at: Date; admin_email: string; action: string; target_type: string; target_id: string | null; reason: string | null; details: Record<string, unknown> }[];
  return rows.map((r) => ({
    id: String(r.id),
    at: new Date(r.created_at).toISOString(),
    adminEmail: r.admin_email,
    action: r.action,
    targetType: r.target_type,
    targetId: r.target_id,
    reason: r.reason,
    details: r.details,
  }));
}
