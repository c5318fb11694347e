/**
 * npm run bench: speed and memory, measured here and never in unit tests.
 * 1. The engineering core ranking each demo design against the whole demo catalogue (in process).
 * 2. HTTP load with autocannon against a throwaway stack: design matching and the motor calculator.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import autocannon from 'autocannon';
import { demoDiodes, demoDrivers, demoMosfets, demoMotors } from '../db/seeds/data/index.ts';
import { demoDesigns } from '../db/seeds/designs.ts';
import { DEMO_DOMAIN, DEMO_PASSWORD } from '../db/seeds/demo.ts';
import { matchDesign } from '../src/lib/design-match.ts';
import type { DesignInput } from '../src/lib/domain/design.ts';
import type { PartOf } from '../src/lib/domain/parts.ts';
import { startThrowawayStack } from './stack/throwaway.ts';
import { Teardown, stopOnSignals } from './stack/teardown.ts';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
process.chdir(root);

function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];
}

function benchCore(iterations: number): void {
  let id = 1;
  const ids = <T extends object>(l: readonly T[]) => l.map((p) => ({ ...p, id: id++ }));
  const catalogue = {
    mosfets: ids(demoMosfets) as PartOf<'mosfet'>[],
    drivers: ids(demoDrivers) as PartOf<'driver'>[],
    diodes: ids(demoDiodes) as PartOf<'diode'>[],
    excluded: { switch: 0, driver: 0, diode: 0 },
  };
  const none = { chosenPartId: null, alternatePartIds: [] };
  for (const d of demoDesigns) {
    const { motorMpn, ready: _r, ...rest } = d;
    const motor = demoMotors.find((m) => m.mpn === motorMpn)!;
    const input: DesignInput = {
      ...rest,
      motor: { source: 'catalogue', partId: 1 },
      selections: { switch: none, driver: none, diode: none },
    };
    global.gc?.();
    const heapBefore = process.memoryUsage().heapUsed;
    const times: number[] = [];
    for (let i = 0; i < iterations; i++) {
      const t0 = performance.now();
      matchDesign(input, motor.mpn, motor.params, catalogue);
      times.push(performance.now() - t0);
    }
    times.sort((a, b) => a - b);
    const heapMiB = (process.memoryUsage().heapUsed - heapBefore) / 2 ** 20;
    console.log(
      `core  ${d.name.padEnd(58)} median ${percentile(times, 50).toFixed(2)} ms  p95 ${percentile(times, 95).toFixed(2)} ms  heap Δ ${heapMiB.toFixed(1)} MiB (${iterations} runs, ${catalogue.mosfets.length + catalogue.drivers.length + catalogue.diodes.length} parts)`,
    );
  }
}

async function load(title: string, opts: autocannon.Options): Promise<void> {
  const r = await autocannon({ duration: 5, connections: 8, ...opts });
  console.log(
    `http  ${title.padEnd(40)} ${r.requests.average.toFixed(0)} req/s  p50 ${r.latency.p50} ms  p99 ${r.latency.p99} ms  non-2xx ${r.non2xx}  errors ${r.errors}`,
  );
}

benchCore(Number(process.env.BENCH_ITERATIONS ?? 200));
process.env.CALC_RATE_LIMIT_PER_MIN = '100000000';
const teardown = new Teardown();
stopOnSignals(
  teardown,
  () => undefined,
  () => 130,
);
const stack = await startThrowawayStack(root, teardown);
try {
  const signin = await fetch(`${stack.url}/api/auth/signin`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: `designer@${DEMO_DOMAIN}`, password: DEMO_PASSWORD }),
  });
  const cookie = (signin.headers.get('set-cookie') ?? '').split(';')[0];
  const designs = (await (await fetch(`${stack.url}/api/designs`, { headers: { cookie } })).json()) as {
    items: { id: number; name: string }[];
  };
  const pump = designs.items.find((d) => d.name.startsWith('P-20'))!;
  await load('POST /api/designs/:id/match (pump)', {
    url: `${stack.url}/api/designs/${pump.id}/match`,
    method: 'POST',
    body: '{}',
    headers: { 'content-type': 'application/json', cookie },
  });
  await load('POST /api/calc/motor', {
    url: `${stack.url}/api/calc/motor`,
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({
      motor: { ratedVoltageV: 3, noLoadSpeedRpm: 12000, noLoadCurrentA: 0.2, stallCurrentA: 1.8, stallTorqueNm: 0.0033953 },
      supplyV: 3,
    }),
  });
  await load('GET /api/health', { url: `${stack.url}/api/health` });
  console.log(`rss   ${(process.memoryUsage().rss / 2 ** 20).toFixed(0)} MiB (bench process, app server in process)`);
} finally {
  await stack.cleanup();
}
process.exit(0);
