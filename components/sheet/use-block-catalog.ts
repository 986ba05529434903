'use client';
import { use } from 'react';
import { catalogUrl } from '@/lib/sheet/catalog-url';
import type { BlockCatalogData } from '@/lib/sheet/types';

// The block-type catalog (~100 kB) is not sent inside the sheet page's React payload: the page names its
// version and the browser fetches `GET /api/catalog?v=<version>` once (cached for good; the page preloads
// it). The server-side render reads the same catalog from the process (lib/sheet/catalog.server.ts
// `publishedCatalog`), so the HTML is complete; in the browser, hydration waits for the catalog
// (React `use`), which changes nothing in the markup.

const loads = new Map<string, Promise<BlockCatalogData>>();


function load(version: string): Promise<BlockCatalogData> {
  let pending = loads.get(version);
  if (!pending) {
    pending = fetch(catalogUrl(version), { credentials: 'same-origin' }).then(async (response) => {
      if (!response.ok) throw new Error(`The block catalog could not be loaded (${response.status}).`);
      return (await response.json()) as BlockCatalogData;
    });
    // Marked settled the way React reads a promise, so a render after the load does not suspend again;
    // a failed load is forgotten, so the error page's retry fetches again.
    const settled = pending as Promise<BlockCatalogData> & { status?: string; value?: BlockCatalogData; reason?: unknown };
    settled.status = 'pending';
    settled.then(
      (value) => Object.assign(settled, { status: 'fulfilled', value }),
      (reason) => {
        Object.assign(settled, { status: 'rejected', reason });
        loads.delete(version);
      },
    );
    loads.set(version, pending);
  }
  return pending;
}

/** Starts loading the catalog the page preloads, as soon as this module runs in the browser. */
if (typeof document !== 'undefined') {
  const preloaded = document.querySelector<HTMLLinkElement>('link[rel="preload"][href^="/api/catalog?v="]');
  const version = preloaded ? new URL(preloaded.href).searchParams.get('v') : null;
  if (version) void load(version).catch(() => undefined);
}

/** The block catalog of the given version. */
export function useBlockCatalog(version: string): BlockCatalogData {
  if (typeof window === 'undefined') {
    const published = (globalThis as Record<symbol, { version: string; catalog: BlockCatalogData } | undefined>)[Symbol.for('denudata.blockCatalog')];
    if (!published || published.version !== version) throw new Error('The block catalog was not published for this render.');
    return published.catalog;
  }
  return use(load(version));
}
