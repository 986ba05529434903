/** File names of a report's downloads: lower-case words of the title joined by hyphens, ASCII only. */
export function reportFileStem(title: string, revision: number): string {
  const slug =
    title.normalize('NFD').replace(/[\u0300-\u036f]/g, '').toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'sheet';
  return `${slug}-r${revision}`;
}
