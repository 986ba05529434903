import 'server-only';
import { Op } from 'sequelize';
import { badRequest, forbidden, notFound } from '@/lib/errors';
import { AuditEntry, Comment, Membership, Sheet, User } from '@/models';
import { recordAudit } from './audit';
import { blockNameAt, blocksUnchangedSince, revisionBlockKey } from './document-blocks';
import { isUuid } from './ids';
import { db } from './index';
import { toPublicUser, type PublicUser } from './users';
import { extractMentionHandles, resolveMentions } from '@/lib/comments/mentions';

export type CommentItem = {
  id: string;
  blockId: string;
  revision: number;
  parentId: string | null;
  author: PublicUser | null;
  body: string;
  mentions: PublicUser[];
  createdAt: string;
  updatedAt: string;
  edited: boolean;
  resolved: boolean;
  resolvedAt: string | null;
  resolvedBy: PublicUser | null;
  /** Made on an earlier revision, and the block has changed (or gone) since. */
  outdated: boolean;
};

export type CommentThread = CommentItem & { replies: CommentItem[] };

/**
 * At most this many of a sheet's newest comments are listed (with the first comment of each of their threads,
 * when older): a sheet may gather any number of comments, and the sheet page asks for them every 20 s.
 */
export const MAX_LISTED_COMMENTS = 500;

// ---------- mentions ----------

// The pure rules live in lib/comments/mentions.ts (the comment box uses them too).
export { extractMentionHandles, handlesOf, resolveMentions } from '@/lib/comments/mentions';

export async function listTeamMembersAsPeople({ teamId }: { teamId: string }): Promise<PublicUser[]> {
  db();
  const memberships = await Membership.findAll({ where: { teamId }, include: [User] });
  return memberships.map((m) => toPublicUser((m as Membership & { User: User }).User));
}

// ---------- reading ----------

/**
 * A sheet's comments as threads (oldest first), optionally for one block, with the open-thread count
 * of every block (for the sheet page's badges). Only the MAX_LISTED_COMMENTS newest comments are listed, each
 * in its thread (whose first comment comes with it even when older); `total` counts them all and `listed`
 * those in `items`, so a reader can say that older ones are left out.
 */
export async function listCommentsBySheet({
  sheetId,
  blockId,
}: {
  sheetId: string;
  blockId?: string;
}): Promise<{ items: CommentThread[]; total: number; listed: number; openByBlock: Record<string, number> }> {
  db();
  const sheet = await Sheet.findByPk(sheetId, { attributes: ['id', 'teamId', 'headRevision'] }); // not the draft
  if (!sheet) throw notFound('Sheet');
  const where = { sheetId, ...(blockId ? { blockId } : {}) };
  const [newest, total, open] = await Promise.all([
    Comment.findAll({ where, order: [['createdAt', 'DESC'], ['id', 'DESC']], limit: MAX_LISTED_COMMENTS }),
    Comment.count({ where }),
    Comment.count({ where: { sheetId, parentId: null, resolvedAt: null }, group: ['blockId'] }),
  ]);
  // The first comment of a listed reply's thread, when it is older than the newest ones.
  const listedIds = new Set(newest.map((c) => c.id));
  const missingRoots = [...new Set(newest.map((c) => c.parentId).filter((id): id is string => id !== null && !listedIds.has(id)))];
  const roots = missingRoots.length ? await Comment.findAll({ where: { id: missingRoots, sheetId } }) : [];
  const comments = [...newest, ...roots].sort((a, b) => new Date(a.createdAt).getTime() - new Date(b.createdAt).getTime() || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const openByBlock: Record<string, number> = {};
  for (const row of open as unknown as { blockId: string; count: number | string }[]) openByBlock[row.blockId] = Number(row.count);

  // Outdated: made on an earlier revision (or on the draft before the first one, a state that is gone) and the
  // block is not the same in the head revision (changed, or gone).
  const earlier = (c: Comment) => sheet.headRevision > 0 && c.revision < sheet.headRevision;
  const unchanged = await blocksUnchangedSince(
    sheetId,
    sheet.headRevision,
    comments.filter((c) => earlier(c) && c.revision > 0).map((c) => ({ revision: c.revision, blockId: c.blockId })),
  );
  const outdated = (c: Comment) => earlier(c) && !unchanged.has(revisionBlockKey(c.revision, c.blockId));

  const members = await listTeamMembersAsPeople({ teamId: sheet.teamId });
  const people = new Map(members.map((m) => [m.id, m]));
  const missing = comments.flatMap((c) => [c.authorId, c.resolvedBy]).filter((id): id is string => Boolean(id) && !people.has(id!));
  if (missing.length) for (const u of await User.findAll({ where: { id: [...new Set(missing)] } })) people.set(u.id, toPublicUser(u));

  const edited = new Set(
    comments.length
      ? (
          await AuditEntry.findAll({
            where: { action: 'comment.edited', subjectType: 'comment', subjectId: { [Op.in]: comments.map((c) => c.id) } },
            attributes: ['subjectId'],
          })
        ).map((a) => a.subjectId)
      : [],
  );
  const toItem = (c: Comment): CommentItem => ({
    id: c.id,
    blockId: c.blockId,
    revision: c.revision,
    parentId: c.parentId,
    author: people.get(c.authorId) ?? null,
    body: c.body,
    mentions: resolveMentions(extractMentionHandles(c.body), members),
    createdAt: new Date(c.createdAt).toISOString(),
    updatedAt: new Date(c.updatedAt).toISOString(),
    edited: edited.has(c.id),
    resolved: c.resolvedAt !== null,
    resolvedAt: c.resolvedAt ? new Date(c.resolvedAt).toISOString() : null,
    resolvedBy: c.resolvedBy ? people.get(c.resolvedBy) ?? null : null,
    outdated: outdated(c),
  });

  const threads = new Map<string, CommentThread>();
  for (const c of comments) {
    if (!c.parentId) threads.set(c.id, { ...toItem(c), replies: [] });
  }
  for (const c of comments) {
    if (!c.parentId) continue;
    threads.get(c.parentId)?.replies.push(toItem(c));
  }
  const items = [...threads.values()];
  return { items, total, listed: comments.length, openByBlock };
}

// ---------- writing ----------

export type CreatedComment = {
  comment: CommentItem;
  sheet: { id: string; title: string; teamId: string };
  blockName: string;
  mentioned: PublicUser[];
};

/**
 * Adds a comment (or a reply) on a block as it was in a given revision: the revision must exist (0 only
 * while the sheet has none, for the draft), and the block must be in it. A reply joins its parent's
 * thread (one level: a reply to a reply joins the same thread) and takes its block and revision.
 */
export async function createComment({
  sheetId,
  authorId,
  blockId,
  revision,
  body,
  parentId,
}: {
  sheetId: string;
  authorId: string;
  blockId: string;
  revision: number;
  body: string;
  parentId?: string;
}): Promise<CreatedComment> {
  const sequelize = db();
  return sequelize.transaction(async (transaction) => {
    // Not the draft: the block's name is looked up in PostgreSQL (blockNameAt), no document is read here.
    const sheet = await Sheet.findByPk(sheetId, { transaction, attributes: ['id', 'teamId', 'title', 'headRevision'] });
    if (!sheet) throw notFound('Sheet');
    let anchorBlock = blockId;
    let anchorRevision = revision;
    let threadId: string | null = null;
    let blockName: string;
    if (parentId) {
      const parent = await Comment.findOne({ where: { id: parentId, sheetId }, transaction });
      if (!parent) throw badRequest('parentId: there is no such comment on this sheet', 'parentId');
      threadId = parent.parentId ?? parent.id;
      anchorBlock = parent.blockId;
      anchorRevision = parent.revision;
      blockName = (await blockNameAt({ sheetId, revision: anchorRevision, blockId: anchorBlock, transaction })) ?? anchorBlock;
    } else {
      if (revision === 0 && sheet.headRevision > 0) {
        throw badRequest('revision: comment on a saved revision (0 is only for a sheet without revisions)', 'revision');
      }
      const found = await blockNameAt({ sheetId, revision, blockId, transaction });
      if (found === undefined) throw badRequest(`revision: this sheet has no revision ${revision}`, 'revision');
      if (found === null) throw badRequest(`blockId: revision ${revision} has no block with id "${blockId}"`, 'blockId');
      blockName = found;
    }
    const comment = await Comment.create(
      { sheetId, blockId: anchorBlock, revision: anchorRevision, parentId: threadId, authorId, body, resolvedAt: null, resolvedBy: null },
      { transaction },
    );
    const members = await listTeamMembersAsPeople({ teamId: sheet.teamId });
    const mentioned = resolveMentions(extractMentionHandles(body), members);
    await recordAudit(
      {
        teamId: sheet.teamId,
        actorId: authorId,
        action: threadId ? 'comment.replied' : 'comment.created',
        subjectType: 'comment',
        subjectId: comment.id,
        details: { sheetId, title: sheet.title, blockId: anchorBlock, revision: anchorRevision, mentions: mentioned.map((m) => m.id) },
      },
      transaction,
    );
    const author = members.find((m) => m.id === authorId) ?? null;
    return {
      comment: {
        id: comment.id,
        blockId: comment.blockId,
        revision: comment.revision,
        parentId: comment.parentId,
        author,
        body: comment.body,
        mentions: mentioned,
        createdAt: new Date(comment.createdAt).toISOString(),
        updatedAt: new Date(comment.updatedAt).toISOString(),
        edited: false,
        resolved: false,
        resolvedAt: null,
        resolvedBy: null,
        outdated: false,
      },
      sheet: { id: sheet.id, title: sheet.title, teamId: sheet.teamId },
      blockName,
      mentioned: mentioned.filter((m) => m.id !== authorId),
    };
  });
}

/** The sheet a comment belongs to (for the route's role check); 404 when unknown. */
export async function findCommentSheetId({ commentId }: { commentId: string }): Promise<string> {
  db();
  if (!isUuid(commentId)) throw notFound('Comment');
  const comment = await Comment.findByPk(commentId, { attributes: ['id', 'sheetId'] });
  if (!comment) throw notFound('Comment');
  return comment.sheetId;
}

/** Resolves or reopens a comment (any role that may comment), or edits its body (its author only). */
export async function updateComment({
  commentId,
  userId,
  resolved,
  body,
}: {
  commentId: string;
  userId: string;
  resolved?: boolean;
  body?: string;
}): Promise<{ id: string; body: string; resolved: boolean; resolvedAt: string | null; resolvedBy: string | null; updatedAt: string }> {
  const sequelize = db();
  return sequelize.transaction(async (transaction) => {
    const comment = await Comment.findByPk(commentId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!comment) throw notFound('Comment');
    const sheet = await Sheet.findByPk(comment.sheetId, { transaction, attributes: ['id', 'teamId', 'title'] });
    let changed = false;
    if (body !== undefined) {
      if (comment.authorId !== userId) throw forbidden('Only the author of a comment can edit it.');
      if (body !== comment.body) {
        await comment.update({ body }, { transaction });
        changed = true;
      }
    }
    if (resolved !== undefined && resolved !== (comment.resolvedAt !== null)) {
      await comment.update(resolved ? { resolvedAt: new Date(), resolvedBy: userId } : { resolvedAt: null, resolvedBy: null }, { transaction });
      changed = true;
    }
    // Only a real change is audited (and a same-text "edit" does not mark the comment edited).
    if (changed) await recordAudit(
      {
        teamId: sheet?.teamId ?? null,
        actorId: userId,
        action: body !== undefined ? 'comment.edited' : resolved ? 'comment.resolved' : 'comment.reopened',
        subjectType: 'comment',
        subjectId: comment.id,
        details: { sheetId: comment.sheetId, title: sheet?.title, blockId: comment.blockId },
      },
      transaction,
    );
    return {
      id: comment.id,
      body: comment.body,
      resolved: comment.resolvedAt !== null,
      resolvedAt: comment.resolvedAt ? new Date(comment.resolvedAt).toISOString() : null,
      resolvedBy: comment.resolvedBy,
      updatedAt: new Date(comment.updatedAt).toISOString(),
    };
  });
}

