import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';

/** The text of every page of a PDF, as pdfjs-dist (legacy build for Node) reads it; white space collapsed. */
export async function pdfPages(bytes: Uint8Array): Promise<string[]> {
  const pdf = await getDocument({ data: new Uint8Array(bytes), useSystemFonts: false, isEvalSupported: false }).promise;
  const pages: string[] = [];
  for (let i = 1; i <= pdf.numPages; i += 1) {
    const page = await pdf.getPage(i);
    const content = await page.getTextContent();
    // Pieces that touch on one line are one word (the layout splits runs at font and script changes).
    let text = '';
    let end: { x: number; y: number } | null = null;
    for (const item of content.items) {
      if (!('str' in item)) continue;
      const x = item.transform[4] as number;
      const y = item.transform[5] as number;
      const touches = end !== null && Math.abs(y - end.y) < 1 && Math.abs(x - end.x) < 0.8;
      text += (touches ? '' : ' ') + item.str;
      end = { x: x + item.width, y };
    }
    pages.push(text.replace(/\s+/g, ' ').trim());
  }
  await pdf.destroy();
  return pages;
}

/** Font names (as the PDF embeds them) of the text runs that contain `needle`. */
export async function fontsOf(bytes: Uint8Array, needle: string): Promise<string[]> {
  const pdf = await getDocument({ data: new Uint8Array(bytes), useSystemFonts: false, isEvalSupported: false, fontExtraProperties: true }).promise;
  const fonts = new Set<string>();
  for (let i = 1; i <= pdf.numPages; i += 1) {
    const page = await pdf.getPage(i);
    const content = await page.getTextContent();
    await page.getOperatorList();
    for (const item of content.items) {
      if (!('str' in item) || !item.str.includes(needle)) continue;
      const font = page.commonObjs.has(item.fontName) ? (page.commonObjs.get(item.fontName) as { name?: string }) : null;
      fonts.add(font?.name ?? item.fontName);
    }
  }
  await pdf.destroy();
  return [...fonts];
}
