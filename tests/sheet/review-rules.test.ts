import { describe, expect, it } from 'vitest';
import { allowedReviewActions, reviewRefusal, type ReviewSituation } from '@/lib/auth/review-rules';

// The sign-off rules shared by the server and the UI (lib/auth/review-rules.ts): the contract's roles table (§5)
// and independent checking — the author never checks, returns or approves their own revision, and the checker
// does not also approve it (common practice of design checking).
const base: ReviewSituation = { role: 'owner', actorId: 'u1', authorId: 'a', checkedById: null, status: 'unsigned', isHead: true };

describe('review rules', () => {
  it.each([
    // role, status, author?, checker?, expected actions
    ['owner', 'unsigned', false, false, ['request']],
    ['editor', 'returned', false, false, ['request']],
    ['reviewer', 'unsigned', false, false, []],
    ['viewer', 'in_review', false, false, []],
    ['reviewer', 'in_review', false, false, ['check', 'return']],
    ['editor', 'in_review', false, false, []],
    ['owner', 'in_review', true, false, []],
    ['owner', 'checked', false, false, ['return', 'approve']],
    ['owner', 'checked', false, true, ['return']],
    ['reviewer', 'checked', false, false, ['return']],
    ['owner', 'approved', false, false, []],
  ] as const)('%s on a %s revision (author: %s, checker: %s) may %j', (role, status, author, checker, expected) => {
    const situation: ReviewSituation = { ...base, role, status, authorId: author ? 'u1' : 'a', checkedById: checker ? 'u1' : 'c' };
    expect(allowedReviewActions(situation)).toEqual(expected);
  });

  it('should give the first rule broken, in the order the server checks them', () => {
    expect(reviewRefusal('approve', { ...base, role: 'editor', status: 'checked' })).toBe('role');
    expect(reviewRefusal('check', { ...base, status: 'in_review', isHead: false })).toBe('not_head');
    expect(reviewRefusal('check', { ...base, status: 'in_review', authorId: 'u1' })).toBe('author');
    expect(reviewRefusal('approve', { ...base, status: 'checked', checkedById: 'u1' })).toBe('checker');
    expect(reviewRefusal('request', { ...base, evaluating: true })).toBe('evaluating');
    expect(reviewRefusal('approve', { ...base, status: 'in_review' })).toBe('status');
    expect(reviewRefusal('request', { ...base, authorId: 'u1' })).toBeNull();
    expect(allowedReviewActions({ ...base, isHead: false })).toEqual([]);
  });
});
