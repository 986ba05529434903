// Ctrl+K (⌘K) pressed while a workspace page is still loading its scripts. A small inline script (rendered
// by the workspace layout, with the page's CSP nonce) listens from the moment the HTML is parsed: it keeps
// the palette request and what is typed after it, so the palette opens with that query once the page is
// interactive instead of the key going to the browser (its own Ctrl+K) or being lost.

/** What the inline script leaves on `window` for the palette to take. */
export type EarlyPaletteKeys = { open: boolean; query: string; listener: (event: KeyboardEvent) => void };

/** Longest query kept before the page is interactive (the palette's own field is not bounded tighter). */
export const EARLY_QUERY_MAX = 200;

const GLOBAL = '__denudataEarlyPalette';

/** The inline script's source: no dependency, so it runs before any chunk arrives. */
export const earlyPaletteScript = `(function(){var s={open:false,query:''};s.listener=function(e){if((e.ctrlKey||e.metaKey)&&!e.altKey&&(e.key==='k'||e.key==='K')){e.preventDefault();s.open=!s.open;s.query='';return}if(!s.open)return;if(e.key==='Escape'){s.open=false;s.query=''}else if(e.key==='Backspace'){s.query=s.query.slice(0,-1)}else if(e.key.length===1&&!e.ctrlKey&&!e.metaKey&&!e.altKey){if(s.query.length<${EARLY_QUERY_MAX})s.query+=e.key}else return;e.preventDefault()};window.${GLOBAL}=s;window.addEventListener('keydown',s.listener,true)})()`;

/**
 * Stops the inline script's listener and, if it kept a palette request, hands its query to `open`. Called
 * by the palette when it starts listening itself; later calls find nothing and do nothing.
 */
export function takeEarlyPaletteKeys(open: (query: string) => void): void {
  if (typeof window === 'undefined') return;
  const holder = window as unknown as Record<string, EarlyPaletteKeys | undefined>;
  const early = holder[GLOBAL];
  if (!early) return;
  window.removeEventListener('keydown', early.listener, true);
  delete holder[GLOBAL];
  if (early.open) open(early.query.slice(0, EARLY_QUERY_MAX));
}
