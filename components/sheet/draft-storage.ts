import type { SheetDocument } from '@/lib/sheet/types';

/** Unsaved edits kept in this browser until the server acknowledges them (restored on the next visit). */
export interface PendingEdits {
  baseVersion: number;
  baseDocument: SheetDocument;
  document: SheetDocument;
  at: string;
}

const storageKey = (sheetId: string) => `denudata-draft:${sheetId}`;

export function readPending(sheetId: string): PendingEdits | null {
  try {
    const text = localStorage.getItem(storageKey(sheetId));
    return text ? (JSON.parse(text) as PendingEdits) : null;
  } catch {
    return null;
  }
}

export function writePending(sheetId: string, pending: PendingEdits | null) {
  try {
    if (pending) localStorage.setItem(storageKey(sheetId), JSON.stringify(pending));
    else localStorage.removeItem(storageKey(sheetId));
  } catch {
    // storage full or blocked: the edit still lives in memory and is saved to the server
  }
}
