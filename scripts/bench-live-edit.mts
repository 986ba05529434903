/**
 * Browser benchmark (not a test): keystroke → updated result on the demo sheet "Quillan Hill", over 20 edits,
 * with evaluation of the unsaved document after a 150 ms pause (live) and, as the baseline in the same run, with
 * it switched off for the page (localStorage `denudata-live-evaluation` = `off`: results then come only after
 * the 600 ms save and the stored draft's evaluation, as before). Needs the built app serving the seeded demo
 * data (the test build and database after a browser-suite run): with DENUDATA_DB, DENUDATA_DIST_DIR and
 * DENUDATA_TEST_PORT set, `npx tsx --conditions=react-server scripts/bench-live-edit.mts` serves the build on that
 * port itself (rate limits off), runs, and stops it.
 * The time is measured inside the page: from the keydown of the edit's last character to the change of the
 * lowering block's result cell (performance.now()).
 */
import { launchBrowser, signInThroughForm } from '../tests/support/browser';
import { startAppInstance } from '../tests/support/app-instance';
import { appUrl } from '../tests/support/http';

const EDITS = 20;

async function run(mode: 'live' | 'baseline'): Promise<number[]> {
  const browser = await launchBrowser();
  try {
    const context = await browser.newContext({ viewport: { width: 1366, height: 900 } });
    if (mode === 'baseline') await context.addInitScript(() => localStorage.setItem('denudata-live-evaluation', 'off'));
    const page = await context.newPage();
    await signInThroughForm(page, 'editor@demo.test');
    const list = await (await page.request.get(`${appUrl()}/api/sheets?q=Quillan`)).json();
    const sheetId = list.items[0].id as string;
    await page.goto(`${appUrl()}/sheets/${sheetId}?draft=1`);
    await page.waitForFunction(() => document.querySelectorAll('section[data-state="stale"], section[data-state="running"]').length === 0, null, { timeout: 60_000 });
    const field = page.locator('section[data-block-name="ridge"]').getByRole('textbox', { name: 'Parameter K of ridge', exact: true });
    await field.waitFor({ timeout: 30_000 });
    const times: number[] = [];
    for (let i = 0; i < EDITS; i++) {
      const value = `${(0.004 + 0.0001 * (i + 1)).toFixed(4)} m^2/yr`;
      await field.click();
      await page.keyboard.press('ControlOrMeta+A');
      await page.keyboard.type(value.slice(0, -1), { delay: 20 });
      await page.evaluate(() => {
        const w = window as unknown as { __bench: { key: number; change: number | null } };
        const cell = document.querySelector('section[data-block-name="lowering"] tr[data-output="lowering_rate"] [data-testid="output-value"]')!;
        const before = cell.textContent;
        w.__bench = { key: 0, change: null };
        window.addEventListener('keydown', () => (w.__bench.key = performance.now()), { once: true, capture: true });
        const observer = new MutationObserver(() => {
          if (cell.textContent !== before && w.__bench.change === null) {
            w.__bench.change = performance.now();
            observer.disconnect();
          }
        });
        observer.observe(cell, { childList: true, characterData: true, subtree: true });
      });
      await page.keyboard.type(value.slice(-1));
      await page.waitForFunction(() => (window as unknown as { __bench: { change: number | null } }).__bench.change !== null, null, { timeout: 30_000 });
      const { key, change } = await page.evaluate(() => (window as unknown as { __bench: { key: number; change: number } }).__bench);
      times.push(change - key);
      // Let the save settle before the next edit, as a person pausing between values would.
      await page.waitForFunction(() => document.querySelector('[data-testid="save-state"]')?.getAttribute('data-kind') === 'saved', null, { timeout: 30_000 });
    }
    return times;
  } finally {
    await browser.close();
  }
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2]! : (s[s.length / 2 - 1]! + s[s.length / 2]!) / 2;
};

const port = Number(process.env.DENUDATA_TEST_PORT ?? '3100');
process.env.DENUDATA_APP_URL = `http://127.0.0.1:${port}`;
const app = await startAppInstance({ port, quiet: true, env: { DENUDATA_RATE_LIMITS: 'off' } });
let baseline: number[];
let live: number[];
try {
  baseline = await run('baseline');
  live = await run('live');
} finally {
  await app.stop();
}
const fmt = (xs: number[]) => `median ${median(xs).toFixed(0)} ms (min ${Math.min(...xs).toFixed(0)}, max ${Math.max(...xs).toFixed(0)})`;
console.log(`keystroke → result over ${EDITS} edits`);
console.log(`  baseline (save, then evaluate the stored draft): ${fmt(baseline)}`);
console.log(`  live (unsaved document after a 150 ms pause):    ${fmt(live)}`);
console.log(`  ratio live / baseline: ${(median(live) / median(baseline)).toFixed(2)}`);
