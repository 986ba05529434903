import type { TeamRole } from '@/models';

// The roles table of the contract (§5), as data. Every route and action asks here.
export type TeamAction =
  | 'read'
  | 'edit'
  | 'comment'
  | 'request_review'
  | 'check'
  | 'approve'
  | 'manage_members';

export const PERMISSIONS: Record<TeamAction, readonly TeamRole[]> = {
  read: ['owner', 'editor', 'reviewer', 'viewer'],
  edit: ['owner', 'editor'],
  comment: ['owner', 'editor', 'reviewer'],
  request_review: ['owner', 'editor'],
  check: ['owner', 'reviewer'],
  approve: ['owner'],
  manage_members: ['owner'],
};

export function roleAllows(role: TeamRole, action: TeamAction): boolean {
  return PERMISSIONS[action].includes(role);
}

export const ROLE_LABELS: Record<TeamRole, string> = {
  owner: 'Owner',
  editor: 'Editor',
  reviewer: 'Reviewer',
  viewer: 'Viewer',
};
