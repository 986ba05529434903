import { describe, expect, it } from 'vitest';
import { handleFor, mentionAtCaret, mentionCandidates, mentionSegments, unresolvedMentions } from '@/lib/comments/mentions';

// The demo team's invented people (lib/db/seed.ts).
const members = [
  { id: 'o', name: 'Maren Okafor', email: 'owner@demo.test' },
  { id: 'e', name: 'Tomas Rinaldi', email: 'editor@demo.test' },
  { id: 'r', name: 'Ilse Varga', email: 'reviewer@demo.test' },
  { id: 'v', name: 'Priya Halvorsen', email: 'viewer@demo.test' },
];

describe('mentions in the comment box', () => {
  it('should find the mention being typed at the caret, and nothing inside an e-mail address', () => {
    expect(mentionAtCaret('cc @to', 6)).toEqual({ from: 3, query: 'to' });
    expect(mentionAtCaret('@', 1)).toEqual({ from: 0, query: '' });
    expect(mentionAtCaret('mail x@demo', 11)).toBeNull();
    expect(mentionAtCaret('cc @tomas done', 14)).toBeNull();
  });

  it('should offer the members whose name or address fits, best first', () => {
    expect(mentionCandidates('to', members).map((m) => m.id)).toEqual(['e']);
    expect(mentionCandidates('var', members).map((m) => m.id)).toEqual(['r']);
    expect(mentionCandidates('', members)).toHaveLength(4);
    expect(mentionCandidates('zz', members)).toEqual([]);
  });

  it('should write a handle that reaches exactly the chosen person', () => {
    expect(handleFor(members[1]!, members)).toBe('editor');
    expect(unresolvedMentions(`@${handleFor(members[1]!, members)}`, members)).toEqual([]);
  });

  it('should warn about @Tom, which notifies nobody, but not about @tomas or @tomas.rinaldi', () => {
    expect(unresolvedMentions('see @Tom and @tomas', members)).toEqual([{ handle: 'tom', reason: 'nobody' }]);
    expect(unresolvedMentions('@tomas.rinaldi please check', members)).toEqual([]);
    const twins = [...members, { id: 't2', name: 'Tomas Berg', email: 'tb@demo.test' }];
    expect(unresolvedMentions('@tomas', twins)).toEqual([{ handle: 'tomas', reason: 'several' }]);
  });

  it('should cut a body into text and mentions, marking whom each reaches', () => {
    const segments = mentionSegments('Ask @ilse and @Tom, please.', members);
    expect(segments.map((s) => s.text)).toEqual(['Ask ', '@ilse', ' and ', '@Tom', ', please.']);
    expect(segments[1]).toMatchObject({ mention: true, person: { id: 'r' } });
    expect(segments[3]).toMatchObject({ mention: true });
    expect(segments[3]!.person).toBeUndefined();
  });
});
