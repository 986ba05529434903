import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { NoteMarkdown } from '@/components/blocks/note-markdown';

// The notes' markdown subset (components/blocks/note-markdown.tsx): what it draws, and that nothing a note
// says becomes live HTML or a script link (CommonMark's syntax for the subset: common practice).
const html = (text: string) => renderToStaticMarkup(createElement(NoteMarkdown, { text }));

describe('note markdown', () => {
  it('should draw headings, paragraphs, lists, emphasis, code and links', () => {
    expect(html('# Site\nFan gravels\nof the scarp')).toBe('<h3>Site</h3><p>Fan gravels of the scarp</p>');
    expect(html('### Detail')).toBe('<h4>Detail</h4>');
    expect(html('- one\n- **two**\n\n1. first\n2. *second*')).toBe('<ul><li>one</li><li><strong>two</strong></li></ul><ol><li>first</li><li><em>second</em></li></ol>');
    expect(html('K from `scarp_age` and [the survey](https://example.org/er-3)')).toBe(
      '<p>K from <code>scarp_age</code> and <a href="https://example.org/er-3" rel="noopener noreferrer nofollow" target="_blank">the survey</a></p>',
    );
    expect(html('[write](mailto:team@example.org)')).toContain('href="mailto:team@example.org"');
  });

  it('should show raw HTML as text and never make a script or relative link', () => {
    expect(html('<img src=x onerror=alert(1)>')).toBe('<p>&lt;img src=x onerror=alert(1)&gt;</p>');
    expect(html('[click](javascript:alert(1))')).not.toContain('href');
    expect(html('[local](/sheets/1)')).toBe('<p>local</p>');
    expect(html('**<b>bold</b>**')).toBe('<p><strong>&lt;b&gt;bold&lt;/b&gt;</strong></p>');
  });
});

// CommonMark beyond the old subset, now that notes are parsed by mdast-util-from-markdown (the PDF's parser).
// Expected trees follow the CommonMark 0.31 specification's examples (commonmark.org/spec: tight and loose
// lists, block quotes, fenced code, hard breaks, reference links, HTML blocks).
describe('note markdown through the CommonMark parser', () => {
  it('should draw block quotes, fenced code, rules, hard breaks, nested and numbered lists', () => {
    expect(html('> quoted\n> text')).toBe('<blockquote><p>quoted text</p></blockquote>');
    expect(html('```\nK = 1e-2 m^2/s\n<b>\n```')).toBe('<pre><code>K = 1e-2 m^2/s\n&lt;b&gt;</code></pre>');
    expect(html('above\n\n***\n\nbelow')).toBe('<p>above</p><hr/><p>below</p>');
    expect(html('one  \ntwo')).toBe('<p>one<br/>two</p>');
    expect(html('- a\n  - b\n- c')).toBe('<ul><li>a<ul><li>b</li></ul></li><li>c</li></ul>');
    expect(html('3. third\n4. fourth')).toBe('<ol start="3"><li>third</li><li>fourth</li></ol>');
    // A loose list (items apart by a blank line) keeps its paragraphs.
    expect(html('- a\n\n- b')).toBe('<ul><li><p>a</p></li><li><p>b</p></li></ul>');
  });

  it('should resolve reference links and keep the same rules for their addresses', () => {
    expect(html('See [the log][log].\n\n[log]: https://example.org/log "Log"')).toBe(
      '<p>See <a href="https://example.org/log" rel="noopener noreferrer nofollow" target="_blank">the log</a>.</p>',
    );
    expect(html('[bad][x]\n\n[x]: javascript:alert(1)')).toBe('<p>bad</p>');
    expect(html('<https://example.org/a>')).toContain('href="https://example.org/a"');
    expect(html('[data](data:text/html,<script>alert(1)</script>)')).not.toContain('href');
    expect(html('[upper](JAVASCRIPT:alert(1))')).not.toContain('href');
  });

  it('should show images as their description and never load them, and keep HTML in every position as text', () => {
    expect(html('![a scarp](https://example.org/x.png)')).toBe('<p>a scarp</p>');
    expect(html('<script>alert(1)</script>')).toBe('<p>&lt;script&gt;alert(1)&lt;/script&gt;</p>');
    expect(html('a <span onclick="x()">b</span> c')).toBe('<p>a &lt;span onclick=&quot;x()&quot;&gt;b&lt;/span&gt; c</p>');
    expect(html('&lt;b&gt; &amp; &copy;')).toBe('<p>&lt;b&gt; &amp; ©</p>');
  });

  it('should draw deep nesting as text instead of recursing without bound', () => {
    const deep = `${'> '.repeat(40)}deep`;
    const out = html(deep);
    expect(out).toContain('deep');
    expect((out.match(/<blockquote>/g) ?? []).length).toBeLessThanOrEqual(13);
  });

  // Drawings are kept by text (a bounded cache: the same note is drawn for every request of its sheet).
  it('should draw a text again exactly as the first time, and each text as its own', () => {
    const a = '# Fan\n**offset** 2a = 2.4 m';
    const b = '# Fan\n**offset** 2a = 2.5 m';
    const first = html(a);
    expect(first).toBe('<h3>Fan</h3><p><strong>offset</strong> 2a = 2.4 m</p>');
    expect(html(b)).toBe('<h3>Fan</h3><p><strong>offset</strong> 2a = 2.5 m</p>');
    expect(html(a)).toBe(first);
    // Two notes with the same text on one page share the drawing and both show it.
    const twice = renderToStaticMarkup(createElement('div', null, createElement(NoteMarkdown, { text: a }), createElement(NoteMarkdown, { text: a })));
    expect(twice).toBe(`<div>${first}${first}</div>`);
    // A text over the kept length (64 kB) is drawn every time, the same way.
    const long = `${'word '.repeat(14_000)}end`;
    expect(html(long)).toBe(`<p>${long}</p>`);
    expect(html(long)).toBe(`<p>${long}</p>`);
  });
});
