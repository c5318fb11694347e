/**
 * What this run started, so that exactly that is stopped again: on success, on an error and on a
 * signal, also one that arrives during start-up. A step is added the moment its thing starts; steps
 * run once, newest first, and one failing step does not keep the others from running.
 */
import { log } from './log.ts';

interface Step {
  name: string;
  run: () => Promise<void> | void;
}

export class Teardown {
  private steps: Step[] = [];
  private running: Promise<void> | null = null;

  add(name: string, run: () => Promise<void> | void): void {
    this.steps.push({ name, run });
  }

  /** Names of the steps still to run (newest first), for messages and tests. */
  pending(): string[] {
    return this.steps.map((s) => s.name).reverse();
  }

  run(): Promise<void> {
    this.running ??= (async () => {
      while (this.steps.length) {
        const step = this.steps.pop()!;
        try {
          await step.run();
        } catch (err) {
          log(`could not stop ${step.name}: ${(err as Error).message}`);
        }
      }
    })();
    return this.running;
  }
}

/**
 * Installs SIGINT/SIGTERM handlers at once (before anything starts): the first signal runs the
 * teardown and exits with `exitCodeFor(signal)`; a second one exits at once.
 */
export function stopOnSignals(
  teardown: Teardown,
  before: (signal: NodeJS.Signals) => void,
  exitCodeFor: (signal: NodeJS.Signals) => number,
): void {
  let stopping = false;
  const handler = (signal: NodeJS.Signals): void => {
    if (stopping) {
      log(`${signal} again: exiting without waiting`);
      process.exit(exitCodeFor(signal));
    }
    stopping = true;
    before(signal);
    void teardown.run().then(() => {
      log('stopped cleanly');
      process.exit(exitCodeFor(signal));
    });
  };
  process.on('SIGINT', handler);
  process.on('SIGTERM', handler);
}
