import 'server-only';
import { appLink, sendMail, sendMails, type Delivery } from '@/lib/mail';
import {
  invitationMessage,
  mentionMessage,
  passwordResetMessage,
  reviewDecisionMessage,
  reviewRequestMessage,
} from '@/lib/mail/messages';
import type { CreatedComment } from '@/lib/db/comments';
import type { ReviewNotice } from '@/lib/db/review';
import type { PublicUser } from '@/lib/db/users';

// What to e-mail after an action has been committed. Each returns whether every message went out;
// a failure is already logged by the mailer and never undoes the action.

export const revisionPath = (sheetId: string, revision: number) => `/sheets/${sheetId}/revisions/${revision}`;
export const invitationPath = (token: string) => `/invitations/${encodeURIComponent(token)}`;
export const passwordResetPath = (token: string) => `/reset-password/${encodeURIComponent(token)}`;

export async function notifyReview(notice: ReviewNotice): Promise<Delivery> {
  const link = appLink(revisionPath(notice.sheet.id, notice.revision));
  const messages = notice.recipients.map((to) =>
    notice.action === 'request'
      ? reviewRequestMessage({ to: to.email, sheetTitle: notice.sheet.title, revision: notice.revision, requestedBy: notice.actor, message: notice.message, link })
      : reviewDecisionMessage({
          to: to.email,
          sheetTitle: notice.sheet.title,
          revision: notice.revision,
          decision: notice.action as 'check' | 'return' | 'approve',
          decidedBy: notice.actor,
          message: notice.message,
          link,
        }),
  );
  return sendMails(messages);
}

export async function notifyMentions(created: CreatedComment, author: PublicUser): Promise<Delivery> {
  const link = appLink(`/sheets/${created.sheet.id}?block=${encodeURIComponent(created.comment.blockId)}&comment=${created.comment.id}`);
  return sendMails(
    created.mentioned.map((person) =>
      mentionMessage({ to: person.email, sheetTitle: created.sheet.title, blockName: created.blockName, author, body: created.comment.body, link }),
    ),
  );
}

export async function notifyInvitation(input: { to: string; teamName: string; role: string; invitedBy: PublicUser; token: string }): Promise<Delivery & { link: string }> {
  const link = appLink(invitationPath(input.token));
  const delivery = await sendMail(invitationMessage({ to: input.to, teamName: input.teamName, role: input.role, invitedBy: input.invitedBy, link }));
  return { ...delivery, link };
}

export async function notifyPasswordReset(input: { to: string; token: string }): Promise<Delivery> {
  return sendMail(passwordResetMessage({ to: input.to, link: appLink(passwordResetPath(input.token)) }));
}
