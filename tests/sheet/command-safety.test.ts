import { defaultFilter } from 'cmdk';
import { describe, expect, it } from 'vitest';
import { isRiskyCommand, needsConfirmation, riskyCommandScore } from '@/components/palette/command-safety';

// The palette's ranking as cmdk applies it: the entry with the highest score is selected, so Enter runs it.
interface Entry {
  id: string;
  group: string;
  title: string;
}

function ranked(entries: Entry[], search: string): Entry[] {
  const scored = entries.map((entry) => {
    const value = `${entry.group}: ${entry.title} ${entry.id}`;
    const base = defaultFilter(value, search);
    return { entry, score: isRiskyCommand(entry.id) ? riskyCommandScore(entry.title, search, base) : base };
  });
  return scored.filter((s) => s.score > 0).sort((a, b) => b.score - a.score).map((s) => s.entry);
}

const SHEET_COMMANDS: Entry[] = [
  { id: 'delete', group: 'Block', title: 'Delete hillslope_1' },
  { id: 'duplicate', group: 'Block', title: 'Duplicate hillslope_1' },
  { id: 'export', group: 'Sheet', title: 'Export the sheet as JSON' },
  { id: 'review-request-u1', group: 'Review', title: 'Ask Tomas Reyes to check r1' },
  { id: 'save-revision', group: 'Sheet', title: 'Save a revision' },
  { id: 'add-scarp_fit', group: 'Add block', title: 'Add Scarp profile fit' },
];

describe('palette safety', () => {
  it('should never preselect a destructive command on a loose match ("csv")', () => {
    const list = ranked(SHEET_COMMANDS, 'csv');
    expect(list.map((e) => e.id)).not.toContain('delete');
  });

  it('should never preselect a review request that sends e-mail on a loose match ("fit")', () => {
    const list = ranked(SHEET_COMMANDS, 'fit');
    expect(list[0]?.id).toBe('add-scarp_fit');
    expect(list.map((e) => e.id)).not.toContain('review-request-u1');
  });

  it('should still find a risky command by a plain match of its title (then a confirmation guards it)', () => {
    expect(ranked(SHEET_COMMANDS, 'delete')[0]?.id).toBe('delete');
    expect(ranked(SHEET_COMMANDS, 'ask tomas')[0]?.id).toBe('review-request-u1');
    expect(ranked(SHEET_COMMANDS, 'dup').map((e) => e.id)).toEqual(['duplicate']);
  });

  it('should put risky commands after every safe one when nothing is typed', () => {
    const list = ranked(SHEET_COMMANDS, '');
    const firstRisky = list.findIndex((e) => isRiskyCommand(e.id));
    const lastSafe = list.map((e) => isRiskyCommand(e.id)).lastIndexOf(false);
    expect(firstRisky).toBeGreaterThan(lastSafe);
  });

  it('should ask for confirmation before deleting, not before a review action (it has its own note step)', () => {
    expect(needsConfirmation('delete')).toBe(true);
    expect(needsConfirmation('review-check')).toBe(false);
    expect(isRiskyCommand('review-check')).toBe(true);
    expect(isRiskyCommand('duplicate')).toBe(false);
  });
});
