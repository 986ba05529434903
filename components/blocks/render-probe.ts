/**
 * A test probe: when a browser test sets `window.__denudataRenderCounts = {}`, every block card counts its
 * renders there by block id (tests/e2e/render-count.test.ts). Without that object it does nothing.
 */
type ProbeWindow = { __denudataRenderCounts?: Record<string, number> };

export function countRender(blockId: string): void {
  if (typeof window === 'undefined') return;
  const counts = (window as unknown as ProbeWindow).__denudataRenderCounts;
  if (counts) counts[blockId] = (counts[blockId] ?? 0) + 1;
}
