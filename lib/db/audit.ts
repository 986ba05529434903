import 'server-only';
import type { Transaction } from 'sequelize';
import { AuditEntry } from '@/models';
import { db } from './index';

export type AuditInput = {
  teamId: string | null;
  actorId: string | null;
  action: string;
  subjectType: string;
  subjectId?: string | null;
  details?: Record<string, unknown>;
};

/** Appends one line to the audit log, inside the caller's transaction when given. */
export async function recordAudit(entry: AuditInput, transaction?: Transaction): Promise<void> {
  db();
  await AuditEntry.create(
    {
      teamId: entry.teamId,
      actorId: entry.actorId,
      action: entry.action,
      subjectType: entry.subjectType,
      subjectId: entry.subjectId ?? null,
      details: entry.details ?? {},
    },
    { transaction },
  );
}
