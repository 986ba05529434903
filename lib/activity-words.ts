// Plain sentences for audit-log entries, shown in the team's activity list.
type Entry = { action: string; details: Record<string, unknown> };

const text = (v: unknown) => (typeof v === 'string' || typeof v === 'number' ? String(v) : '');

export function describeActivity({ action, details }: Entry): string {
  const title = text(details.title) ? `“${text(details.title)}”` : 'a sheet';
  const rev = text(details.revision);
  switch (action) {
    case 'sheet.created':
      return `created ${title}`;
    case 'sheet.imported':
      return `imported ${title}`;
    case 'sheet.forked':
      return `forked ${text(details.fromTitle) ? `“${text(details.fromTitle)}”` : 'a sheet'} as ${title}${text(details.site) ? ` for ${text(details.site)}` : ''}`;
    case 'sheet.archived':
      return `archived ${title}`;
    case 'sheet.deleted':
      return `deleted ${title}`;
    case 'revision.saved':
      return `saved revision ${rev} of ${title}`;
    case 'review.request':
      return `asked for a check of revision ${rev} of ${title}`;
    case 'review.check':
      return `checked revision ${rev} of ${title}`;
    case 'review.return':
      return `returned revision ${rev} of ${title} for changes`;
    case 'review.approve':
      return `approved revision ${rev} of ${title}`;
    case 'comment.created':
      return `commented on ${title}`;
    case 'comment.replied':
      return `replied to a comment on ${title}`;
    case 'comment.resolved':
      return `resolved a comment on ${title}`;
    case 'comment.reopened':
      return `reopened a comment on ${title}`;
    case 'comment.edited':
      return `edited a comment on ${title}`;
    case 'member.invited':
      return `invited ${text(details.email)} as ${text(details.role)}`;
    case 'member.joined':
      return `joined the team as ${text(details.role)}`;
    case 'member.role_changed':
      return `changed a role from ${text(details.from)} to ${text(details.to)}`;
    case 'member.removed':
      return `removed ${text(details.name) || 'a member'} from the team`;
    case 'team.created':
      return 'created the team';
    case 'user.signed_up':
      return 'signed up';
    default:
      return action.replace(/[._]/g, ' ');
  }
}
