/**
 * The sweep of change alerts inside an app server: every ALERT_SWEEP_S seconds (off at 0, the default
 * under test) it mails the alerts still unsent, e.g. after a mail failure or a server that stopped before
 * its background send finished. Several servers may sweep at once: processPendingAlerts mails each alert
 * under its row lock, once. The timer never keeps the process alive; stop() waits for a sweep in flight.
 */
import type { AppConfig } from './config.ts';
import { processPendingAlerts } from './services/design-alerts.ts';

export interface AlertSweep {
  stop(): Promise<void>;
}

export function startAlertSweep(config: AppConfig, intervalMs = config.alertSweepS * 1000): AlertSweep {
  if (intervalMs <= 0) return { async stop() {} };
  let timer: NodeJS.Timeout | null = null;
  let running: Promise<unknown> | null = null;
  let stopped = false;
  const tick = (): void => {
    running = processPendingAlerts()
      .catch((err: Error) => console.warn(`[stallpoint] alert sweep failed: ${err.message}`))
      .finally(() => {
        running = null;
        if (!stopped) timer = setTimeout(tick, intervalMs).unref();
      });
  };
  timer = setTimeout(tick, intervalMs).unref();
  return {
    async stop() {
      stopped = true;
      if (timer) clearTimeout(timer);
      await running;
    },
  };
}
