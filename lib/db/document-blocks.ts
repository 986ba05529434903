import 'server-only';
import { QueryTypes, type Transaction } from 'sequelize';
import { db } from './index';

// Questions about single blocks of stored sheet documents (a revision's, or the draft), answered inside
// PostgreSQL so that the app never reads a whole document (up to 1 MB) to learn about one block. Used by the
// comments (lib/db/comments.ts): whether a comment's block has changed since, and a block's name.

/** The key of a (revision, block) pair in the set blocksUnchangedSince answers. */
export const revisionBlockKey = (revision: number, blockId: string) => `${revision}\u0000${blockId}`;

/**
 * Of the (revision, block) pairs asked for, the keys (revisionBlockKey) of those whose block is the same in the
 * head revision, compared in PostgreSQL (jsonb equality: key order ignored, numbers by value, as the JSON texts
 * parsed would compare). Each
 * revision's document is expanded once there; only the pairs come back, so a sheet with many large revisions
 * costs the app nothing per listing (the sheet page lists comments every 20 s): it used to read every such
 * document into the app and parse it (about 100 ms of the server's main thread for 40 revisions of 600 kB).
 */
export async function blocksUnchangedSince(sheetId: string, headRevision: number, pairs: { revision: number; blockId: string }[]): Promise<Set<string>> {
  if (pairs.length === 0) return new Set();
  const rows = await db().query<{ revision: number; block_id: string }>(
    `WITH wanted AS (SELECT DISTINCT w.revision, w.block_id FROM unnest($2::int[], $3::text[]) AS w(revision, block_id)),
     then_blocks AS (
       SELECT r.number AS revision, b.value ->> 'id' AS block_id, b.value AS block
         FROM sheet_revisions r CROSS JOIN LATERAL jsonb_array_elements(r.document -> 'blocks') b
        WHERE r.sheet_id = $1 AND r.number IN (SELECT revision FROM wanted)
          AND b.value ->> 'id' IN (SELECT block_id FROM wanted)),
     head_blocks AS (
       SELECT b.value ->> 'id' AS block_id, b.value AS block
         FROM sheet_revisions r CROSS JOIN LATERAL jsonb_array_elements(r.document -> 'blocks') b
        WHERE r.sheet_id = $1 AND r.number = $4 AND b.value ->> 'id' IN (SELECT block_id FROM wanted))
     SELECT w.revision, w.block_id FROM wanted w
       JOIN then_blocks t ON t.revision = w.revision AND t.block_id = w.block_id
       JOIN head_blocks h ON h.block_id = w.block_id
      GROUP BY w.revision, w.block_id
     HAVING bool_and(t.block = h.block)`,
    { bind: [sheetId, pairs.map((p) => p.revision), pairs.map((p) => p.blockId), headRevision], type: QueryTypes.SELECT },
  );
  return new Set(rows.map((r) => revisionBlockKey(r.revision, r.block_id)));
}

/**
 * The name of a block as it is in a revision of a sheet (0: the draft), or its id when it has none; null when the
 * revision has no such block, undefined when there is no such revision. Read in PostgreSQL, so a comment on a
 * sheet with a large document does not parse that document in the app.
 */
export async function blockNameAt({
  sheetId,
  revision,
  blockId,
  transaction,
}: {
  sheetId: string;
  revision: number;
  blockId: string;
  transaction: Transaction;
}): Promise<string | null | undefined> {
  const nameIn = (column: string) =>
    `(SELECT COALESCE(b.value ->> 'name', b.value ->> 'id') FROM jsonb_array_elements(${column} -> 'blocks') b WHERE b.value ->> 'id' = $2 LIMIT 1)`;
  const rows =
    revision === 0
      ? await db().query<{ name: string | null }>(`SELECT ${nameIn('s.draft_document')} AS name FROM sheets s WHERE s.id = $1`, {
          bind: [sheetId, blockId],
          type: QueryTypes.SELECT,
          transaction,
        })
      : await db().query<{ name: string | null }>(`SELECT ${nameIn('r.document')} AS name FROM sheet_revisions r WHERE r.sheet_id = $1 AND r.number = $3`, {
          bind: [sheetId, blockId, revision],
          type: QueryTypes.SELECT,
          transaction,
        });
  return rows.length ? rows[0]!.name : undefined;
}
