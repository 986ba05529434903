/**
 * Fair admission and dispatch of evaluations (CONTRACT §3 Limits): at most `perUserInFlight`
 * evaluations per user queued or running, a newer evaluation of the same sheet by the same user
 * replacing one of theirs still queued, a bounded global queue, and dispatch that takes users in
 * turn (the least recently served first) and never gives one user every slot. Beyond the limits
 * the request is refused at once with 429 and Retry-After, so nothing waits unboundedly.
 *
 * Pure bookkeeping: `start` runs a task (in the app, on the worker pool) and the scheduler only
 * decides when. Per process: each app instance bounds its own pool (the pool is the resource).
 */
import { AppError, rateLimited } from '@/lib/errors';

export interface EvaluationOwner {
  /** The signed-in user the evaluation is for (system tasks use a name of their own). */
  userId: string;
  /** What is evaluated (a sheet id); a newer task with the same key replaces a queued one. */
  key?: string;
}

export interface SchedulerLimits {
  /** Tasks that run at once (the worker threads). */
  slots: number;
  /** Tasks one user may have queued or running. */
  perUserInFlight: number;
  /** Tasks one user may have running at once (fewer than slots, so others always get one). */
  perUserRunning: number;
  /** Tasks waiting in all, over every user. */
  maxQueued: number;
  /** Retry-After for a refusal, in seconds. */
  retryAfterSeconds: number;
}

interface Entry<T> {
  owner: EvaluationOwner;
  start: () => Promise<T>;
  resolve: (value: T) => void;
  reject: (error: unknown) => void;
  running: boolean;
}

interface UserState<T> {
  entries: Entry<T>[];
  running: number;
  /** Dispatch turn at which this user was last served (0: never). */
  lastServed: number;
}

/** The answer given to a queued evaluation that a newer one of the same sheet replaced. */
export function supersededError(): AppError {
  return new AppError('conflict', 'A newer evaluation of the same sheet replaced this one before it started.', {
    extra: { superseded: true },
  });
}

export class FairScheduler<T> {
  private readonly users = new Map<string, UserState<T>>();
  private running = 0;
  private queued = 0;
  private turn = 0;

  constructor(readonly limits: SchedulerLimits) {}

  /** Counts for tests and diagnostics. */
  stats(): { running: number; queued: number; users: number } {
    return { running: this.running, queued: this.queued, users: this.users.size };
  }

  submit(owner: EvaluationOwner, start: () => Promise<T>): Promise<T> {
    const user = this.users.get(owner.userId) ?? { entries: [], running: 0, lastServed: 0 };
    if (owner.key !== undefined) {
      const replaced = user.entries.find((entry) => !entry.running && entry.owner.key === owner.key);
      if (replaced) {
        user.entries.splice(user.entries.indexOf(replaced), 1);
        this.queued--;
        replaced.reject(supersededError());
      }
    }
    if (user.entries.length >= this.limits.perUserInFlight) {
      return Promise.reject(
        rateLimited(
          `You have ${user.entries.length} evaluations running or waiting, the most allowed at once. Try again when one has finished.`,
          this.limits.retryAfterSeconds,
        ),
      );
    }
    if (this.queued >= this.limits.maxQueued) {
      return Promise.reject(rateLimited('The server is busy evaluating. Try again shortly.', this.limits.retryAfterSeconds));
    }
    this.users.set(owner.userId, user);
    return new Promise<T>((resolve, reject) => {
      user.entries.push({ owner, start, resolve, reject, running: false });
      this.queued++;
      this.pump();
    });
  }

  /** Starts queued tasks while slots are free, taking users in turn. */
  private pump(): void {
    while (this.running < this.limits.slots) {
      let chosen: { user: UserState<T>; entry: Entry<T> } | null = null;
      for (const user of this.users.values()) {
        if (user.running >= this.limits.perUserRunning) continue;
        const entry = user.entries.find((candidate) => !candidate.running);
        if (!entry) continue;
        if (!chosen || user.lastServed < chosen.user.lastServed) chosen = { user, entry };
      }
      if (!chosen) return;
      this.launch(chosen.user, chosen.entry);
    }
  }

  private launch(user: UserState<T>, entry: Entry<T>): void {
    entry.running = true;
    user.running++;
    user.lastServed = ++this.turn;
    this.running++;
    this.queued--;
    const finish = () => {
      this.running--;
      user.running--;
      user.entries.splice(user.entries.indexOf(entry), 1);
      if (user.entries.length === 0) this.users.delete(entry.owner.userId);
      this.pump();
    };
    let promise: Promise<T>;
    try {
      promise = entry.start();
    } catch (error) {
      promise = Promise.reject(error);
    }
    promise.then(
      (value) => {
        finish();
        entry.resolve(value);
      },
      (error: unknown) => {
        finish();
        entry.reject(error);
      },
    );
  }
}
