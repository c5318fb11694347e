/**
 * Turns of the event loop shared by the long jobs of this server (sliced match rankings). Each job awaits
 * nextTurn() between its slices; the waiting jobs resume one per turn of the event loop, in the order they
 * asked, so the server polls for I/O (a health check, a search, a closed socket) after every single slice
 * however many jobs run. With a plain setImmediate each, every job waiting would resume in the same turn,
 * one slice after another, before any I/O is read.
 *
 * Node.js documents the rule this relies on (timers docs, setImmediate): an immediate queued while the
 * immediates run waits for the next turn of the loop, after its poll phase.
 */
const waiting: (() => void)[] = [];
let scheduled = false;

function resumeOne(): void {
  scheduled = false;
  const next = waiting.shift();
  if (waiting.length > 0) {
    scheduled = true;
    setImmediate(resumeOne);
  }
  next?.();
}

/** Resolves on a later turn of the event loop, after I/O has been polled; at most one waiter per turn. */
export function nextTurn(): Promise<void> {
  return new Promise<void>((resolve) => {
    waiting.push(resolve);
    if (!scheduled) {
      scheduled = true;
      setImmediate(resumeOne);
    }
  });
}

/** Jobs waiting for a turn (for tests and tracing). */
export const turnsWaiting = (): number => waiting.length;

/**
 * Runs `each` over `items`, awaiting nextTurn() after every `perTurn` of them: a long synchronous loop of
 * the server (turning 67,000 catalogue rows into parts) taking turns like the sliced rankings do.
 */
export async function eachInTurns<T>(items: readonly T[], each: (item: T) => void, perTurn: number): Promise<void> {
  for (let i = 0; i < items.length; i++) {
    if (i > 0 && i % perTurn === 0) await nextTurn();
    each(items[i]);
  }
}
