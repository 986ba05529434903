/**
 * What the two load scripts share (scripts/load.mts and scripts/load-compare.mts): signing in through
 * next-auth's credentials route, the 50-block chained sheet, and the routes they measure.
 */

export const DEMO_SHEET_ID = '0d3a7e10-5c2b-4f6a-8e1d-000000000001';

/** The session cookie header of an account, or null when the sign-in is refused. */
export async function signIn(base: URL, email: string, password: string): Promise<string | null> {
  const jar = new Map<string, string>();
  const keep = (response: Response) => {
    for (const line of response.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const at = pair!.indexOf('=');
      jar.set(pair!.slice(0, at), pair!.slice(at + 1));
    }
  };
  const cookie = () => [...jar].map(([k, v]) => `${k}=${v}`).join('; ');
  const csrfResponse = await fetch(new URL('/api/auth/csrf', base));
  keep(csrfResponse);
  const { csrfToken } = (await csrfResponse.json()) as { csrfToken: string };
  const response = await fetch(new URL('/api/auth/callback/credentials', base), {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: cookie() },
    body: new URLSearchParams({ csrfToken, email, password, json: 'true' }).toString(),
  });
  keep(response);
  return [...jar.keys()].some((k) => k.includes('session-token')) ? cookie() : null;
}

/** A sheet of a quantities block and a chain of formula blocks, each reading the previous one. */
export function chainedDocument(blocks: number, title = 'Load: 50-block chain') {
  return {
    format: 'denudata-sheet@1',
    title,
    blocks: Array.from({ length: blocks }, (_, i) =>
      i === 0
        ? { id: 'b0', name: 'q0', type: 'quantities', inputs: { K: '0.004 m^2/yr', C: '-0.01 1/m' } }
        : { id: `b${i}`, name: `f${i}`, type: 'formula', inputs: { expr: i === 1 ? 'q0.K * q0.C to mm/yr' : `f${i - 1}.value * 1.001` } },
    ),
  };
}

export interface LoadTarget {
  label: string;
  path: string;
  method?: 'GET' | 'POST';
  body?: string;
  /** Which accounts may make the request: none (signed out), the demo team's members, or anyone signed in. */
  who: 'none' | 'demo' | 'all';
  /** autocannon replaces `[<id>]` in the body with a new id per request (a body never sent before). */
  unique?: boolean;
}

/** The routes issue 8's load figures name, in the order they are measured. */
export const LOAD_TARGETS: LoadTarget[] = [
  { label: 'static file (floor)', path: '/fonts/JetBrainsMono-Regular.woff2', who: 'none' },
  { label: 'GET /api/teams (trivial, signed in)', path: '/api/teams', who: 'demo' },
  { label: 'GET /api/sheets/{id}', path: `/api/sheets/${DEMO_SHEET_ID}`, who: 'demo' },
  { label: 'GET /api/sheets', path: '/api/sheets', who: 'demo' },
  { label: 'POST /api/quick', path: '/api/quick', method: 'POST', body: JSON.stringify({ expr: 'scarp_age(2 m, 0, 25 deg, 1 m^2/kyr)', preview: true }), who: 'all' },
  { label: 'POST /api/evaluate (50 blocks)', path: '/api/evaluate', method: 'POST', body: JSON.stringify({ document: chainedDocument(50) }), who: 'all' },
  // The same evaluation work, but each body's text is new (its title carries a request id), so no answer is reused.
  {
    label: 'POST /api/evaluate (50 blocks, new text each time)',
    path: '/api/evaluate',
    method: 'POST',
    body: JSON.stringify({ document: chainedDocument(50, 'Load: 50-block chain [<id>]') }),
    who: 'all',
    unique: true,
  },
  { label: 'sheet page HTML', path: `/sheets/${DEMO_SHEET_ID}`, who: 'demo' },
];
