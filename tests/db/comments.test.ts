import { beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { db } from '@/lib/db';
import { createComment, extractMentionHandles, listCommentsBySheet, MAX_LISTED_COMMENTS, resolveMentions, updateComment } from '@/lib/db/comments';
import { saveRevision } from '@/lib/db/revision-save';
import { makeSheet, rejection, sampleDocument, useTeamFixture } from '../support/review-fixtures';

describe('mention handles', () => {
  const members = [
    { id: '1', name: 'Ilse Varga', email: 'reviewer@demo.test' },
    { id: '2', name: 'Tomas Rinaldi', email: 'rinaldi@demo.test' },
    { id: '3', name: 'Tomas Berg', email: 'tb@demo.test' },
  ];
  it('should find @handles but not e-mail addresses', () => {
    expect(extractMentionHandles('@reviewer see this, cc @Tomas.Rinaldi. Mail me at x@y.test')).toEqual(['reviewer', 'tomas.rinaldi']);
  });
  it('should resolve by e-mail local part, by full-name handle, and by a first name only when unique', () => {
    expect(resolveMentions(['reviewer', 'tomas.rinaldi', 'ilse'], members).map((m) => m.id)).toEqual(['1', '2']);
    expect(resolveMentions(['tomas'], members)).toEqual([]);
    expect(resolveMentions(['nobody'], members)).toEqual([]);
  });
});

describe('comments (lib/db/comments)', () => {
  const team = useTeamFixture({ closePool: true });
  let sheetId: string;

  beforeAll(async () => {
    sheetId = (await makeSheet(team.teamId, team.people.editor.id)).id;
    await saveRevision({ sheetId, userId: team.people.editor.id, baseRevision: 0, document: sampleDocument(), message: 'r1' });
  });

  it('should thread replies under a comment, count open threads per block, and resolve/reopen them', async () => {
    const reviewerHandle = team.people.reviewer.email.split('@')[0];
    const first = await createComment({ sheetId, authorId: team.people.reviewer.id, blockId: 'b-hill', revision: 1, body: `Is the curvature from the 2 m DEM? @${team.people.editor.email.split('@')[0]}` });
    expect(first.mentioned.map((p) => p.id)).toEqual([team.people.editor.id]);
    expect(first.blockName).toBe('hill');
    const reply = await createComment({ sheetId, authorId: team.people.editor.id, blockId: 'ignored', revision: 0, body: `Yes, @${reviewerHandle}.`, parentId: first.comment.id });
    expect(reply.comment).toMatchObject({ parentId: first.comment.id, blockId: 'b-hill', revision: 1 });
    expect(reply.blockName).toBe('hill'); // the thread's block, named as in its revision
    // A reply to a reply joins the same thread (one level).
    const nested = await createComment({ sheetId, authorId: team.people.owner.id, blockId: 'b-hill', revision: 1, body: 'Fine by me.', parentId: reply.comment.id });
    expect(nested.comment.parentId).toBe(first.comment.id);
    await createComment({ sheetId, authorId: team.people.owner.id, blockId: 'b-params', revision: 1, body: 'Source of K?' });

    let listed = await listCommentsBySheet({ sheetId, blockId: 'b-hill' });
    expect(listed.items).toHaveLength(1);
    expect(listed.items[0]?.replies.map((r) => r.body)).toEqual([`Yes, @${reviewerHandle}.`, 'Fine by me.']);
    expect(listed.openByBlock).toEqual({ 'b-hill': 1, 'b-params': 1 });

    await updateComment({ commentId: first.comment.id, userId: team.people.editor.id, resolved: true });
    listed = await listCommentsBySheet({ sheetId, blockId: 'b-hill' });
    expect(listed.items[0]).toMatchObject({ resolved: true, resolvedBy: { id: team.people.editor.id } });
    expect(listed.openByBlock).toEqual({ 'b-params': 1 });
    await updateComment({ commentId: first.comment.id, userId: team.people.reviewer.id, resolved: false });
    expect((await listCommentsBySheet({ sheetId })).openByBlock['b-hill']).toBe(1);
  });

  it('should let only the author edit the body (403 otherwise) and mark it edited', async () => {
    const made = await createComment({ sheetId, authorId: team.people.reviewer.id, blockId: 'b-params', revision: 1, body: 'Typo here' });
    const error = await rejection(updateComment({ commentId: made.comment.id, userId: team.people.owner.id, body: 'Changed by someone else' }));
    expect(error.status).toBe(403);
    await updateComment({ commentId: made.comment.id, userId: team.people.reviewer.id, body: 'Typo fixed' });
    const item = (await listCommentsBySheet({ sheetId, blockId: 'b-params' })).items.find((c) => c.id === made.comment.id)!;
    expect(item).toMatchObject({ body: 'Typo fixed', edited: true });
  });

  it('should anchor a comment on the draft of a sheet without revisions, named as in the draft, and refuse 0 once there are revisions', async () => {
    const draftOnly = await makeSheet(team.teamId, team.people.editor.id);
    const onDraft = await createComment({ sheetId: draftOnly.id, authorId: team.people.reviewer.id, blockId: 'b-params', revision: 0, body: 'Before any revision' });
    expect(onDraft.blockName).toBe('params');
    expect(onDraft.comment).toMatchObject({ blockId: 'b-params', revision: 0 });
    const replyOnDraft = await createComment({ sheetId: draftOnly.id, authorId: team.people.editor.id, blockId: 'x', revision: 0, body: 'Noted', parentId: onDraft.comment.id });
    expect(replyOnDraft.blockName).toBe('params');
    const missing = await rejection(createComment({ sheetId: draftOnly.id, authorId: team.people.reviewer.id, blockId: 'b-nothing', revision: 0, body: 'x' }));
    expect(missing.field).toBe('blockId');
    expect(missing.message).toBe('blockId: revision 0 has no block with id "b-nothing"');
    const afterSave = await rejection(createComment({ sheetId, authorId: team.people.reviewer.id, blockId: 'b-hill', revision: 0, body: 'x' }));
    expect(afterSave.field).toBe('revision');
  });

  it('should refuse a block that is not in the revision, or a revision that does not exist (400)', async () => {
    const noBlock = await rejection(createComment({ sheetId, authorId: team.people.owner.id, blockId: 'b-missing', revision: 1, body: 'x' }));
    expect(noBlock.status).toBe(400);
    expect(noBlock.field).toBe('blockId');
    const noRevision = await rejection(createComment({ sheetId, authorId: team.people.owner.id, blockId: 'b-hill', revision: 9, body: 'x' }));
    expect(noRevision.field).toBe('revision');
  });

  it('should flag a comment outdated once its block has changed in a later revision, not when another block changed', async () => {
    const sheet = await makeSheet(team.teamId, team.people.editor.id);
    await saveRevision({ sheetId: sheet.id, userId: team.people.editor.id, baseRevision: 0, document: sampleDocument(), message: '' });
    const onParams = await createComment({ sheetId: sheet.id, authorId: team.people.reviewer.id, blockId: 'b-params', revision: 1, body: 'K looks high' });
    const onNote = await createComment({ sheetId: sheet.id, authorId: team.people.reviewer.id, blockId: 'b-note', revision: 1, body: 'Say which cutting' });
    await saveRevision({ sheetId: sheet.id, userId: team.people.editor.id, baseRevision: 1, document: sampleDocument({ K: '0.002 m^2/yr' }), message: 'K lowered' });
    const items = (await listCommentsBySheet({ sheetId: sheet.id })).items;
    expect(items.find((c) => c.id === onParams.comment.id)?.outdated).toBe(true);
    expect(items.find((c) => c.id === onNote.comment.id)?.outdated).toBe(false);
  });

  it('should compare a comment’s block with the head revision only: moved or changed-and-restored is current, removed is outdated', async () => {
    const sheet = await makeSheet(team.teamId, team.people.editor.id);
    const save = (baseRevision: number, document: ReturnType<typeof sampleDocument>) =>
      saveRevision({ sheetId: sheet.id, userId: team.people.editor.id, baseRevision, document, message: `r${baseRevision + 1}` });
    const comment = async (blockId: string, revision: number) =>
      (await createComment({ sheetId: sheet.id, authorId: team.people.reviewer.id, blockId, revision, body: `${blockId} at ${revision}` })).comment.id;
    await save(0, sampleDocument());
    const onParams = await comment('b-params', 1);
    const onNote = await comment('b-note', 1);
    const onHill = await comment('b-hill', 1);
    // r2: K changed and the note removed; r3: K as in r1 again, the blocks in another order, inputs written in
    // another key order, the note still gone.
    const r2 = sampleDocument({ K: '0.002 m^2/yr' });
    r2.blocks = r2.blocks.filter((b) => b.id !== 'b-note');
    await save(1, r2);
    const onParamsAtTwo = await comment('b-params', 2);
    const r3 = sampleDocument();
    const [params, hill] = r3.blocks as [{ inputs: Record<string, string> }, unknown];
    params.inputs = { C: params.inputs.C!, K: params.inputs.K! };
    r3.blocks = [hill, params] as typeof r3.blocks;
    await save(2, r3);
    const onHillAtHead = await comment('b-hill', 3);
    const outdated = new Map((await listCommentsBySheet({ sheetId: sheet.id })).items.map((c) => [c.id, c.outdated]));
    expect(Object.fromEntries([onParams, onNote, onHill, onParamsAtTwo, onHillAtHead].map((id) => [id, outdated.get(id)]))).toEqual({
      [onParams]: false, // changed in r2, the same again in r3 (the head)
      [onNote]: true, // gone from the head
      [onHill]: false, // moved, not changed
      [onParamsAtTwo]: true, // K of r2 is not the head's
      [onHillAtHead]: false, // made on the head
    });
  });

  it('should list only the newest MAX_LISTED_COMMENTS comments, with the start of their threads, and count them all', async () => {
    const own = (await makeSheet(team.teamId, team.people.editor.id)).id;
    await saveRevision({ sheetId: own, userId: team.people.editor.id, baseRevision: 0, document: sampleDocument(), message: 'r1' });
    // An old thread on hill made the ordinary way, 520 replies to it and then 3 new threads on params, each a
    // second apart (made in one INSERT … SELECT: the listing reads them as any comment).
    const root = await createComment({ sheetId: own, authorId: team.people.reviewer.id, blockId: 'b-hill', revision: 1, body: 'The first question' });
    await db().query(
      `INSERT INTO comments (sheet_id, block_id, revision, parent_id, author_id, body, created_at, updated_at)
       SELECT :sheetId, 'b-hill', 1, :root, :author, 'Reply ' || lpad(g::text, 3, '0'), now() + g * interval '1 second', now() + g * interval '1 second'
         FROM generate_series(1, 520) g`,
      { replacements: { sheetId: own, root: root.comment.id, author: team.people.editor.id }, type: QueryTypes.INSERT },
    );
    await db().query(
      `INSERT INTO comments (sheet_id, block_id, revision, author_id, body, created_at, updated_at)
       SELECT :sheetId, 'b-params', 1, :author, 'New thread ' || g, now() + (600 + g) * interval '1 second', now() + (600 + g) * interval '1 second'
         FROM generate_series(1, 3) g`,
      { replacements: { sheetId: own, author: team.people.owner.id }, type: QueryTypes.INSERT },
    );
    const listing = await listCommentsBySheet({ sheetId: own });
    expect(MAX_LISTED_COMMENTS).toBe(500);
    expect(listing.total).toBe(1 + 520 + 3);
    // The 500 newest are the 3 new threads and replies 024 … 520; the old first comment comes with its thread.
    expect(listing.listed).toBe(501);
    expect(listing.items.map((t) => t.body)).toEqual(['The first question', 'New thread 1', 'New thread 2', 'New thread 3']);
    const replies = listing.items[0]!.replies.map((r) => r.body);
    expect(replies.length).toBe(497);
    expect(replies[0]).toBe('Reply 024');
    expect(replies.at(-1)).toBe('Reply 520');
    // Open threads are counted over all comments, listed or not.
    expect(listing.openByBlock).toEqual({ 'b-hill': 1, 'b-params': 3 });
    // For one block: its newest 500 and the count of all its comments.
    const hill = await listCommentsBySheet({ sheetId: own, blockId: 'b-hill' });
    expect(hill).toMatchObject({ total: 521, listed: 501 });
    expect(hill.items[0]!.replies[0]!.body).toBe('Reply 021');
    const params = await listCommentsBySheet({ sheetId: own, blockId: 'b-params' });
    expect(params).toMatchObject({ total: 3, listed: 3 });
  });
});
