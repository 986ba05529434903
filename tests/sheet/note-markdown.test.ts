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
