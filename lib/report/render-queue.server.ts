import 'server-only';
import { AppError } from '@/lib/errors';

// PDF layout runs on the server's main thread: at most two at a time in a process, at most ten
// waiting, so one person asking for many reports cannot hold up everyone else's pages.
const MAX_RUNNING = 2;
const MAX_WAITING = 10;
let running = 0;
const waiting: (() => void)[] = [];

export async function withRenderSlot<T>(work: () => Promise<T>): Promise<T> {
  if (running >= MAX_RUNNING) {
    if (waiting.length >= MAX_WAITING) throw new AppError('rate_limited', 'Too many reports are being made right now; try again in a few seconds.', { retryAfter: 5 });
    await new Promise<void>((resolve) => waiting.push(resolve));
  }
  running += 1;
  try {
    return await work();
  } finally {
    running -= 1;
    waiting.shift()?.();
  }
}
