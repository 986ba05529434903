'use client';

/** Opens the browser's print dialog (hidden when printing, like every button). */
export function PrintButton() {
  return (
    <button type="button" onClick={() => window.print()} className="rounded-[4px] border border-rule px-2 py-1 text-[13px] hover:bg-wash">
      Print
    </button>
  );
}
