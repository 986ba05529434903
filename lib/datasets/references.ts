/**
 * Which datasets a sheet document refers to: every `dataset("<sha256>")` in its inputs (CONTRACT §7.6).
 * Used for usedBy, delete refusals, revision checks and bundles. Pure.
 */

const REFERENCE = /dataset\(\s*"([0-9a-f]{64})"\s*\)/g;

/** The distinct hashes referred to by a document's block inputs, in order of first appearance. */
export function datasetReferences(document: unknown): string[] {
  const found = new Set<string>();
  const blocks = (document as { blocks?: unknown } | null)?.blocks;
  if (!Array.isArray(blocks)) return [];
  for (const block of blocks) {
    const inputs = (block as { inputs?: unknown } | null)?.inputs;
    if (!inputs || typeof inputs !== 'object') continue;
    for (const value of Object.values(inputs as Record<string, unknown>)) {
      if (typeof value !== 'string' || !value.includes('dataset')) continue;
      for (const match of value.matchAll(REFERENCE)) found.add(match[1]!);
    }
  }
  return [...found];
}

/** The text written into a data input for a dataset. */
export function datasetCall(sha256: string): string {
  return `dataset("${sha256}")`;
}

/** The hash of an input that holds exactly one `dataset("…")` call, else null. */
export function datasetOfInput(text: string): string | null {
  const match = /^\s*dataset\(\s*"([0-9a-f]{64})"\s*\)\s*$/.exec(text);
  return match ? match[1]! : null;
}
