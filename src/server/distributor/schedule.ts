/**
 * The scheduled distributor refresh inside an app server: every DISTRIBUTOR_REFRESH_MIN minutes (off at
 * 0, the default under test), one refresh; when several app servers run, the lock in MariaDB lets one of
 * them do it each time, and a server skips a round another one started less than 0.9 intervals ago, so the
 * distributor is asked once per interval however many servers there are. The timer never keeps the process alive; stop() waits for a refresh in flight.
 */
import type { AppConfig } from '../config.ts';
import { db } from '../db.ts';
import { clientOptions } from './options.ts';
import { refreshOffers } from './refresh.ts';

export interface Schedule {
  stop(): Promise<void>;
}

export function startDistributorSchedule(config: AppConfig, intervalMs = config.distributor.refreshMin * 60_000): Schedule {
  const url = config.distributor.url;
  if (!url || intervalMs <= 0) return { async stop() {} };
  let timer: NodeJS.Timeout | null = null;
  let running: Promise<unknown> | null = null;
  let stopped = false;
  const tick = (): void => {
    // A round another server started less than 0.9 intervals ago counts as this one's (timers drift apart).
    running = refreshOffers({
      db: db(),
      client: clientOptions(url, config),
      lockTtlS: config.distributor.lockS,
      minGapS: (0.9 * intervalMs) / 1000,
    })
      .catch((err: Error) => console.warn(`[distributor] scheduled refresh failed: ${err.message}`))
      .finally(() => {
        running = null;
        if (!stopped) timer = setTimeout(tick, intervalMs).unref();
      });
  };
  timer = setTimeout(tick, Math.min(intervalMs, 10_000)).unref();
  return {
    async stop() {
      stopped = true;
      if (timer) clearTimeout(timer);
      await running;
    },
  };
}
