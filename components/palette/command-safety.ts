/**
 * Which palette commands must never run by accident: destructive ones (delete) and those that reach
 * other people (review actions send e-mail, invitations, sign-out ends the session). cmdk selects the
 * best-scoring entry as the user types, so a loose match ("csv" → "Delete hillslope_1") could make such
 * a command the default on Enter. They are found only by a plain match of their title (every word typed
 * starts a word of it), and destructive ones ask for confirmation before they run.
 */
const RISKY_ID = /^(delete|remove|review-|invite|sign-out|archive)/;
const CONFIRMED_ID = /^(delete|remove|archive|sign-out)/;

export function isRiskyCommand(id: string): boolean {
  return RISKY_ID.test(id);
}

/** Whether running the command asks "are you sure?" first. */
export function needsConfirmation(id: string): boolean {
  return CONFIRMED_ID.test(id);
}

/** Below any safe entry when nothing is typed, so the first entry of the full list is never risky. */
const UNSEARCHED_WEIGHT = 1e-4;

/**
 * The score of a risky command for a search: 0 (hidden) unless every word of the search is the start
 * of a word of its title, then cmdk's own score. With nothing typed it ranks after every safe entry.
 */
export function riskyCommandScore(title: string, search: string, baseScore: number): number {
  const words = search.toLowerCase().split(/\s+/).filter(Boolean);
  if (words.length === 0) return baseScore * UNSEARCHED_WEIGHT;
  const titleWords = title.toLowerCase().split(/[^\p{L}\p{N}_]+/u).filter(Boolean);
  const plain = words.every((word) => titleWords.some((titleWord) => titleWord.startsWith(word)));
  return plain ? baseScore : 0;
}
