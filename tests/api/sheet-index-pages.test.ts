import { describe, expect, it } from 'vitest';
import { newAccount } from '../support/http';

// The sheet index (/sheets) shows a team's sheets 100 to a page (SHEET_PAGE_SIZE), with the range, the page
// and links to the pages before and after; a new search or sort starts again at the first page.

/** A page's HTML with React's text separators taken out, so that text written in parts reads as one. */
const text = (html: string) => html.replace(/<!-- -->/g, '');

describe('the sheet index in pages', () => {
  it('should show 100 sheets a page with the range, and reach the 101st on page 2', async () => {
    const { client } = await newAccount('index-pages');
    // A new account's own team holds no sheet yet; 101 sheets, titled so that sorting by title is their order.
    for (let i = 1; i <= 101; i += 1) {
      const created = await client.post('/api/sheets', { title: `Paging check ${String(i).padStart(3, '0')}` });
      expect(created.status).toBe(201);
    }
    const first = await client.get<string>('/sheets?sort=title');
    expect(first.status).toBe(200);
    const one = text(first.body);
    expect(one).toContain('1–100 of 101 sheets');
    expect(one).toContain('Page 1 of 2');
    expect(one).toContain('Paging check 100');
    expect(one).not.toContain('Paging check 101');
    expect(one).toMatch(/<a[^>]*href="\/sheets\?sort=title&amp;page=2"[^>]*rel="next"|<a[^>]*rel="next"[^>]*href="\/sheets\?sort=title&amp;page=2"/);
    expect(one).toContain('Next 1 →');
    expect(one).not.toContain('rel="prev"');
    // The column headers sort anew from the first page (no page in their links).
    expect(one).toMatch(/href="\/sheets\?sort=-title"/);

    const second = text((await client.get<string>('/sheets?sort=title&page=2')).body);
    expect(second).toContain('101–101 of 101 sheets');
    expect(second).toContain('Page 2 of 2');
    expect(second).toContain('Paging check 101');
    expect(second).not.toContain('Paging check 100<');
    expect(second).toMatch(/href="\/sheets\?sort=title"[^>]*rel="prev"|rel="prev"[^>]*href="\/sheets\?sort=title"/);
    expect(second).not.toContain('rel="next"');

    // Past the last page: no rows, and a way back to it; a page that is not a number is the first page.
    const beyond = text((await client.get<string>('/sheets?sort=title&page=9')).body);
    expect(beyond).toContain('There are 2 pages of sheets.');
    expect(beyond).toMatch(/href="\/sheets\?sort=title&amp;page=2"[^>]*>Go to the last page/);
    expect(text((await client.get<string>('/sheets?sort=title&page=two')).body)).toContain('1–100 of 101 sheets');

    // A search that finds fewer than a page shows no page links.
    const searched = text((await client.get<string>('/sheets?q=check%2001&sort=title')).body); // 010 … 019
    expect(searched).toContain('>10 sheets<');
    expect(searched).not.toContain('Pages of sheets');
  });
});

describe('the revision history in pages', () => {
  it('should page GET …/revisions with limit and offset, and the history page 100 revisions a page', async () => {
    const { client } = await newAccount('history-pages');
    const sheetId = (await client.post('/api/sheets', { title: 'History pages' })).body.sheet.id as string;
    const document = (n: number) => ({ format: 'denudata-sheet@1', title: `History pages ${n}`, blocks: [] });
    for (let n = 1; n <= 102; n += 1) {
      const saved = await client.post(`/api/sheets/${sheetId}/revisions`, { baseRevision: n - 1, document: document(n), message: `save ${n}` });
      expect(saved.status, `revision ${n}`).toBe(201);
    }
    const first = await client.get(`/api/sheets/${sheetId}/revisions?limit=3`);
    expect(first.status).toBe(200);
    expect(first.body.total).toBe(102);
    expect(first.body.items.map((r: { number: number }) => r.number)).toEqual([102, 101, 100]);
    const later = await client.get(`/api/sheets/${sheetId}/revisions?limit=2&offset=100`);
    expect(later.body.items.map((r: { number: number }) => r.number)).toEqual([2, 1]);
    expect((await client.get(`/api/sheets/${sheetId}/revisions`)).body.items.length).toBe(100);
    for (const [query, field] of [['limit=0', 'limit'], ['limit=501', 'limit'], ['offset=-2', 'offset'], ['page=2', undefined]] as const) {
      const response = await client.get(`/api/sheets/${sheetId}/revisions?${query}`);
      expect(response.status, query).toBe(400);
      expect(response.body.error.field, query).toBe(field);
    }

    const one = text((await client.get<string>(`/sheets/${sheetId}/revisions`)).body);
    expect(one).toContain('r102–r3 of 102 revisions · page 1 of 2');
    expect(one).toContain('save 3<');
    expect(one).not.toContain('save 2<');
    expect(one).toContain('(newest)');
    // The oldest row of the page links to its changes from the revision before it, on the next page.
    expect(one).toContain(`/sheets/${sheetId}/compare?from=2&amp;to=3`);
    expect(one).toMatch(new RegExp(`href="/sheets/${sheetId}/revisions\\?page=2"[^>]*rel="next"|rel="next"[^>]*href="/sheets/${sheetId}/revisions\\?page=2"`));

    const two = text((await client.get<string>(`/sheets/${sheetId}/revisions?page=2`)).body);
    expect(two).toContain('r2–r1 of 102 revisions · page 2 of 2');
    expect(two).not.toContain('(newest)');
    expect(two).toContain(`/sheets/${sheetId}/compare?from=1&amp;to=2`);
    expect(two).toMatch(/rel="prev"/);
    expect(text((await client.get<string>(`/sheets/${sheetId}/revisions?page=7`)).body)).toContain('There are 2 pages of revisions.');
  });
});
