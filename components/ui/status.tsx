// Review states in Denudata's own words, each with a mark and a word, never colour alone.
export type SheetStatus = 'draft' | 'unsigned' | 'in_review' | 'checked' | 'approved' | 'returned';

export const STATUS_WORDS: Record<SheetStatus, { word: string; mark: string; tone: string }> = {
  draft: { word: 'Draft only', mark: '○', tone: 'text-slate' },
  unsigned: { word: 'Not yet reviewed', mark: '◌', tone: 'text-slate' },
  in_review: { word: 'Awaiting check', mark: '◔', tone: 'text-ochre' },
  checked: { word: 'Checked', mark: '◑', tone: 'text-river' },
  approved: { word: 'Approved', mark: '●', tone: 'text-moss' },
  returned: { word: 'Returned for changes', mark: '↺', tone: 'text-oxide' },
};

export function StatusTag({ status }: { status: SheetStatus }) {
  const s = STATUS_WORDS[status];
  return (
    <span className={`inline-flex items-center gap-1 whitespace-nowrap text-[12px] ${s.tone}`}>
      <span aria-hidden="true">{s.mark}</span>
      {s.word}
    </span>
  );
}
