/**
 * Keeps one child process running for `npm start`: when it ends without being asked to, it is started
 * again after a delay that doubles with each quick failure (1 s, 2 s, 4 s … at most 30 s) and resets once
 * a run has lasted a minute. Every exit and restart is logged. stop() ends supervision first, then
 * stops the child with the caller's function, so a shutdown is never mistaken for a crash.
 */
import type { ChildProcess } from 'node:child_process';
import { log as defaultLog } from './log.ts';

export interface BackoffPolicy {
  initialMs: number;
  maxMs: number;
  /** A run at least this long counts as healthy: the next failure starts the backoff over. */
  stableAfterMs: number;
}

export const DEFAULT_BACKOFF: BackoffPolicy = { initialMs: 1_000, maxMs: 30_000, stableAfterMs: 60_000 };

/** Delay before the `attempt`-th restart in a row (1-based). */
export function backoffDelayMs(policy: BackoffPolicy, attempt: number): number {
  return Math.min(policy.maxMs, policy.initialMs * 2 ** Math.max(0, attempt - 1));
}

export function describeExit(code: number | null, signal: NodeJS.Signals | null): string {
  return signal ? `killed by ${signal}` : `exit code ${code}`;
}

export interface SupervisorOptions {
  name: string;
  /** Starts the child again and resolves once it serves; null = something else serves now, stop watching. */
  restart: () => Promise<ChildProcess | null>;
  /** Whether an exit the supervisor did not ask for is a crash to restart (default: every exit). */
  isCrash?: (code: number | null, signal: NodeJS.Signals | null) => boolean;
  policy?: BackoffPolicy;
  log?: (message: string) => void;
}

export class Supervisor {
  private child: ChildProcess | null = null;
  private startedAt = 0;
  private attempt = 0;
  private stopping = false;
  private timer: NodeJS.Timeout | null = null;
  private restarting: Promise<void> | null = null;
  /** Restarts done so far (for the log and the tests). */
  restarts = 0;

  constructor(private readonly options: SupervisorOptions) {}

  private get policy(): BackoffPolicy {
    return this.options.policy ?? DEFAULT_BACKOFF;
  }

  private log(message: string): void {
    (this.options.log ?? defaultLog)(message);
  }

  /** The child being watched now (null while it is down). */
  current(): ChildProcess | null {
    return this.child;
  }

  /** Watches a running child; its unrequested exit schedules a restart. */
  watch(child: ChildProcess): void {
    this.child = child;
    this.startedAt = Date.now();
    child.once('exit', (code, signal) => this.exited(child, code, signal));
  }

  private exited(child: ChildProcess, code: number | null, signal: NodeJS.Signals | null): void {
    if (this.child !== child) return;
    this.child = null;
    if (this.stopping) return;
    const how = describeExit(code, signal);
    if (this.options.isCrash && !this.options.isCrash(code, signal)) {
      this.log(`${this.options.name} (pid ${child.pid}) ended (${how}) and was stopped on purpose: not restarting it`);
      return;
    }
    if (Date.now() - this.startedAt >= this.policy.stableAfterMs) this.attempt = 0;
    this.log(`${this.options.name} (pid ${child.pid}) crashed (${how})`);
    this.schedule();
  }

  private schedule(): void {
    this.attempt += 1;
    const delay = backoffDelayMs(this.policy, this.attempt);
    this.log(`restarting ${this.options.name} in ${(delay / 1000).toFixed(1)} s (attempt ${this.attempt})`);
    this.timer = setTimeout(() => {
      this.timer = null;
      this.restarting = this.restartNow().finally(() => (this.restarting = null));
    }, delay);
  }

  private async restartNow(): Promise<void> {
    if (this.stopping) return;
    try {
      const child = await this.options.restart();
      if (this.stopping) return;
      if (!child) {
        this.log(`${this.options.name}: another process serves it now; no longer supervised by this run`);
        return;
      }
      this.restarts += 1;
      this.watch(child);
      this.log(`${this.options.name} restarted (pid ${child.pid})`);
    } catch (err) {
      if (this.stopping) return;
      this.log(`${this.options.name} did not start again: ${(err as Error).message.split('\n')[0]}`);
      this.schedule();
    }
  }

  /** Ends supervision (a pending restart is cancelled, one under way awaited), then `stopChild`. */
  async stop(stopChild: (child: ChildProcess) => Promise<void> = async () => {}): Promise<void> {
    this.stopping = true;
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    if (this.restarting) await this.restarting;
    const child = this.child;
    this.child = null;
    if (child && child.exitCode === null && child.signalCode === null) await stopChild(child);
  }
}
