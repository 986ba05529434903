import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

// The engine stays pure (STYLE.md habit 1): no next/*, React, data layer, models or node I/O.
const ENGINE = path.resolve(__dirname, '../../lib/engine');
const FORBIDDEN = [
  /^next(\/|$)/,
  /^react(-dom)?(\/|$)/,
  /(^|\/)lib\/db(\/|$)/,
  /^@\/lib\/db/,
  /(^|\/)models(\/|$)/,
  /^(node:)?(fs|fs\/promises|net|http|https|http2|child_process|dgram|tls|worker_threads)$/,
];

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((entry) => {
    const full = path.join(dir, entry);
    if (statSync(full).isDirectory()) return sourceFiles(full);
    return /\.(ts|tsx|mts|js)$/.test(entry) ? [full] : [];
  });
}

function importsOf(source: string): string[] {
  const pattern = /(?:import|export)\s[^'"]*?from\s+['"]([^'"]+)['"]|import\s*\(\s*['"]([^'"]+)['"]\s*\)|require\s*\(\s*['"]([^'"]+)['"]\s*\)|^\s*import\s+['"]([^'"]+)['"]/gm;
  return [...source.matchAll(pattern)].map((m) => m[1] ?? m[2] ?? m[3] ?? m[4]!).filter(Boolean);
}

describe('engine purity', () => {
  const files = sourceFiles(ENGINE);

  it('should find the engine sources', () => {
    expect(files.length).toBeGreaterThan(10);
  });

  it('should import nothing from next, react, lib/db, models, or node fs/net/http/child_process', () => {
    const offences: string[] = [];
    for (const file of files) {
      for (const spec of importsOf(readFileSync(file, 'utf8'))) {
        if (FORBIDDEN.some((pattern) => pattern.test(spec))) offences.push(`${path.relative(ENGINE, file)} imports ${spec}`);
      }
    }
    expect(offences).toEqual([]);
  });

  it('should use no clock and no unseeded randomness', () => {
    const offences = files.filter((file) => /Date\.now\(|Math\.random\(|new Date\(/.test(readFileSync(file, 'utf8')));
    expect(offences).toEqual([]);
  });

  it('should recognise a forbidden import (the check itself works)', () => {
    expect(importsOf("import fs from 'node:fs';\nimport { x } from \"next/server\";")).toEqual(['node:fs', 'next/server']);
  });
});
