import canonicalize from 'canonicalize';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { afterAll, describe, expect, it } from 'vitest';
import { seedDemo } from '@/lib/db/seed';
import { closeSequelize, getSequelize } from '@/lib/db/sequelize';
import { evaluateSheet, hashSheetDocument, type SheetDocument, type SheetResults } from '@/lib/engine';
import type { DatasetCanonical } from '@/lib/engine/dataset';

interface StoredRevision {
  sheet_id: string;
  number: number;
  hash: string;
  document: SheetDocument;
  results: SheetResults | null;
}

async function storedRevisions(): Promise<StoredRevision[]> {
  return getSequelize().query<StoredRevision>(
    'SELECT sheet_id, number, hash, document, results FROM sheet_revisions ORDER BY sheet_id, number',
    { type: QueryTypes.SELECT },
  );
}

async function count(table: string): Promise<number> {
  const [row] = await getSequelize().query<{ n: string }>(`SELECT count(*) AS n FROM ${table}`, { type: QueryTypes.SELECT });
  return Number(row!.n);
}

function run(script: string, args: string[]): string {
  return execFileSync('bash', [script, ...args], {
    cwd: path.resolve(__dirname, '../..'),
    env: { ...process.env, DENUDATA_DB: process.env.DENUDATA_DB },
    encoding: 'utf8',
  });
}

describe('npm run backup and npm run restore', () => {
  afterAll(closeSequelize);

  it('should round-trip the database, after which every stored revision re-evaluates to its hash and results', async () => {
    await seedDemo();
    const before = await storedRevisions();
    const sheetsBefore = await count('sheets');
    expect(before.length).toBeGreaterThanOrEqual(4);

    const file = path.join(mkdtempSync(path.join(tmpdir(), 'denudata-backup-')), 'round-trip.dump');
    expect(run('scripts/backup.sh', [file])).toMatch(/backup: wrote/);
    expect(statSync(file).size).toBeGreaterThan(1000);

    // A change after the backup that the restore must undo.
    await getSequelize().query(`UPDATE sheets SET title = 'Changed after the backup'`);
    await closeSequelize();

    expect(run('scripts/restore.sh', [file])).toMatch(/restore: restored/);

    const after = await storedRevisions();
    expect(await count('sheets')).toBe(sheetsBefore);
    const [changed] = await getSequelize().query<{ n: string }>(`SELECT count(*) AS n FROM sheets WHERE title = 'Changed after the backup'`, { type: QueryTypes.SELECT });
    expect(Number(changed!.n)).toBe(0);
    expect(after.map((r) => `${r.sheet_id}:${r.number}:${r.hash}`)).toEqual(before.map((r) => `${r.sheet_id}:${r.number}:${r.hash}`));
    // Datasets are restored too, so revisions that refer to measured data re-evaluate as well.
    const stored = await getSequelize().query<{ sha256: string; canonical: string }>('SELECT sha256, canonical FROM datasets', { type: QueryTypes.SELECT });
    const datasets = new Map(stored.map((d) => [d.sha256, JSON.parse(d.canonical) as DatasetCanonical]));
    for (const revision of after) {
      expect(hashSheetDocument(revision.document)).toBe(revision.hash);
      if (revision.results === null) continue; // a revision whose long run has not finished
      // Canonical JSON (RFC 8785): JSONB keeps every value exactly but not key order.
      expect(canonicalize(evaluateSheet(revision.document, { datasets }))).toBe(canonicalize(revision.results));
    }
  });

  it('should refuse to restore without a file, changing nothing', () => {
    expect(() => run('scripts/restore.sh', [])).toThrow();
    expect(() => run('scripts/restore.sh', ['/nonexistent/file.dump'])).toThrow();
  });
});
