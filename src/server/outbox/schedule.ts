/**
 * The background outbox runs inside an app server: every OUTBOX_INTERVAL_S seconds (off at 0, the default
 * under test) deliver the pending e-mail that is due, then delete the datasheet objects still to be
 * deleted. Several servers may run it at once: rows are claimed one by one (src/server/services/outbox.ts).
 * Same shape as the distributor schedule: the timer never keeps the process alive; stop() waits for a run.
 */
import type { AppConfig } from '../config.ts';
import { deletePendingBlobs, deliverPendingMail } from '../services/outbox.ts';

export interface Schedule {
  stop(): Promise<void>;
}

export function startOutboxSchedule(config: AppConfig, intervalMs = config.outbox.intervalS * 1000): Schedule {
  if (intervalMs <= 0) return { async stop() {} };
  let timer: NodeJS.Timeout | null = null;
  let running: Promise<unknown> | null = null;
  let stopped = false;
  const run = async (): Promise<void> => {
    await deliverPendingMail({ outbox: config.outbox, mail: config.mail }).catch((err: Error) =>
      console.warn(`[outbox] mail run failed: ${err.message}`),
    );
    await deletePendingBlobs({ outbox: config.outbox }).catch((err: Error) => console.warn(`[outbox] deletion run failed: ${err.message}`));
  };
  const tick = (): void => {
    running = run().finally(() => {
      running = null;
      if (!stopped) timer = setTimeout(tick, intervalMs).unref();
    });
  };
  timer = setTimeout(tick, Math.min(intervalMs, 5_000)).unref();
  return {
    async stop() {
      stopped = true;
      if (timer) clearTimeout(timer);
      await running;
    },
  };
}
