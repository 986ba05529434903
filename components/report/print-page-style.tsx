// The running header, banner and page numbers of a printed report, in the page's margin boxes
// (CSS Paged Media, Chromium 131+). The text is escaped as a CSS string.
const cssString = (text: string) => `"${text.replace(/\\/g, '\\\\').replace(/"/g, '\\"').replace(/[\n\r\f]/g, ' ').replace(/</g, '\\3c ')}"`;

export function PrintPageStyle({ title, revision, shortHash, banner }: { title: string; revision: number; shortHash: string; banner: string | null }) {
  const css = `@media print { @page {
  margin: 18mm 14mm 16mm;
  @top-left { content: ${cssString(title)}; font-size: 8pt; color: #555; }
  @top-right { content: ${cssString(`r${revision} · ${shortHash}`)}; font-size: 8pt; color: #555; }
  ${banner ? `@top-center { content: ${cssString(banner)}; font-size: 9pt; font-weight: 600; color: #9c3b25; }` : ''}
  @bottom-right { content: "Page " counter(page) " of " counter(pages); font-size: 8pt; color: #555; }
} }`;
  return <style dangerouslySetInnerHTML={{ __html: css }} />;
}
