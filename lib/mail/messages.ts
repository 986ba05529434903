// The messages Denudata sends, as plain data (no I/O): recipient, subject and a plain-text body.
import type { PublicUser } from '@/lib/db/users';

export type MailMessage = { to: string; subject: string; text: string };

/** The one person type, narrowed to what a message names. */
type Person = Pick<PublicUser, 'name' | 'email'>;

const SIGNATURE = '\n\n— Denudata, a shared notebook of erosion calculations.\nYou get this message because of your account or a team invitation.';

export function invitationMessage(input: { to: string; teamName: string; role: string; invitedBy: Person; link: string }): MailMessage {
  return {
    to: input.to,
    subject: `${input.invitedBy.name} invited you to ${input.teamName} on Denudata`,
    text:
      `${input.invitedBy.name} (${input.invitedBy.email}) invited you to join the team "${input.teamName}" as ${input.role}.\n\n` +
      `Accept the invitation: ${input.link}\n\nThe link works once and expires in 7 days.` +
      SIGNATURE,
  };
}

export function reviewRequestMessage(input: {
  to: string;
  sheetTitle: string;
  revision: number;
  requestedBy: Person;
  message?: string;
  link: string;
}): MailMessage {
  return {
    to: input.to,
    subject: `Check requested: ${input.sheetTitle} (revision ${input.revision})`,
    text:
      `${input.requestedBy.name} asks you to check revision ${input.revision} of "${input.sheetTitle}".\n` +
      (input.message ? `\nTheir note: ${input.message}\n` : '') +
      `\nOpen the revision: ${input.link}` +
      SIGNATURE,
  };
}

const DECISION_WORDS = { check: 'checked', return: 'returned for changes', approve: 'approved' } as const;

export function reviewDecisionMessage(input: {
  to: string;
  sheetTitle: string;
  revision: number;
  decision: keyof typeof DECISION_WORDS;
  decidedBy: Person;
  message?: string;
  link: string;
}): MailMessage {
  const word = DECISION_WORDS[input.decision];
  return {
    to: input.to,
    subject: `Revision ${input.revision} of ${input.sheetTitle} was ${word}`,
    text:
      `${input.decidedBy.name} ${word} revision ${input.revision} of "${input.sheetTitle}".\n` +
      (input.message ? `\nTheir note: ${input.message}\n` : '') +
      `\nOpen the revision: ${input.link}` +
      SIGNATURE,
  };
}

export function mentionMessage(input: {
  to: string;
  sheetTitle: string;
  blockName: string;
  author: Person;
  body: string;
  link: string;
}): MailMessage {
  const quoted = input.body.length > 1200 ? `${input.body.slice(0, 1200)}…` : input.body;
  return {
    to: input.to,
    subject: `${input.author.name} mentioned you on ${input.sheetTitle}`,
    text:
      `${input.author.name} mentioned you in a comment on block "${input.blockName}" of "${input.sheetTitle}":\n\n` +
      quoted.split('\n').map((line) => `> ${line}`).join('\n') +
      `\n\nOpen the comment: ${input.link}` +
      SIGNATURE,
  };
}

export function passwordResetMessage(input: { to: string; link: string }): MailMessage {
  return {
    to: input.to,
    subject: 'Set a new Denudata password',
    text:
      `Someone asked to set a new password for the Denudata account ${input.to}.\n\n` +
      `Set a new password: ${input.link}\n\nThe link works once and expires in 1 hour. ` +
      'If you did not ask for this, ignore this message: your password stays as it is.' +
      SIGNATURE,
  };
}
