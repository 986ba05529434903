import 'server-only';
import { QueryTypes } from 'sequelize';
import { db } from './index';

export type ActivityItem = {
  id: string;
  action: string;
  subjectType: string;
  subjectId: string | null;
  details: Record<string, unknown>;
  actor: { id: string; name: string; email: string } | null;
  createdAt: string;
};

/** The team's audit log, newest first, without the draft saves (one every few seconds while someone types). */
export async function listActivityByTeam({ teamId, limit = 50 }: { teamId: string; limit?: number }): Promise<ActivityItem[]> {
  const rows = await db().query<{
    id: string;
    action: string;
    subject_type: string;
    subject_id: string | null;
    details: Record<string, unknown>;
    created_at: Date;
    actor_id: string | null;
    actor_name: string | null;
    actor_email: string | null;
  }>(
    `SELECT a.id, a.action, a.subject_type, a.subject_id, a.details, a.created_at,
            u.id AS actor_id, u.name AS actor_name, u.email AS actor_email
       FROM audit_log a LEFT JOIN users u ON u.id = a.actor_id
      WHERE a.team_id = :teamId AND a.action <> 'draft.saved'
      ORDER BY a.created_at DESC, a.id DESC
      LIMIT :limit`,
    { type: QueryTypes.SELECT, replacements: { teamId, limit } },
  );
  return rows.map((r) => ({
    id: String(r.id),
    action: r.action,
    subjectType: r.subject_type,
    subjectId: r.subject_id,
    details: r.details ?? {},
    actor: r.actor_id ? { id: r.actor_id, name: r.actor_name!, email: r.actor_email! } : null,
    createdAt: new Date(r.created_at).toISOString(),
  }));
}
