/**
 * POST /api/calc/supply against the running stack. The expected figures are re-derived here by hand from
 * the contract's formulas (api-contract.md "POST /api/calc/supply"; docs/engineering.md §3.2–§3.5),
 * never read back from the code:
 *   R = ratedVoltageV/stallCurrentA at 20 °C [docs/engineering.md §2.1]; ω0 = n0·2π/60; Kt = Ke = (V − I0·R)/ω0;
 *   I_start = V/(R + R_s + R_int); held at min(I_start, I_lim); terminals see I·(R + R_s);
 *   T_start = Kt·(I − I0); I_run = I0 + T_load/Kt; τm = J·(R + R_s + R_int)/(Kt·Ke);
 *   C = max(0, I_start − I_avail)·τm/ΔV with I_avail = min(ΔV/R_int, I_lim).
 * The motor is the invented M1 of the contract; 0.5 A is the USB 2.0 port limit [std: USB 2.0 specification].
 */
import fc from 'fast-check';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { appUrl } from '../helpers/stack.ts';
import { MOTOR_M1 } from '../helpers/contract-examples.ts';

const api = () => request(appUrl());
const post = (body: unknown) => api().post('/api/calc/supply').set('Content-Type', 'application/json').send(JSON.stringify(body));

/** The contract's example body, verbatim. */
const EXAMPLE = {
  motor: { ...MOTOR_M1, rotorInertiaKgM2: 1.5e-7 },
  supply: { voltageV: 3.0, internalResistanceOhm: 0.3, continuousCurrentA: 1.0, currentLimitA: 0.5 },
  seriesResistanceOhm: 0,
  windingC: 20,
  loadTorqueNm: 0.0003,
  logic: { sharedWithMotor: true, minSupplyV: 2.7, regulatorDropoutV: 0 },
  allowedDipV: 0.2,
};

// By hand, for the example:
const R = 3 / 1.8; // 1.6667 Ω
const KT = (3 - 0.2 * R) / ((12000 * 2 * Math.PI) / 60); // 2.12207e-3 N·m/A
const I_START = 3.0 / (R + 0 + 0.3); // 1.5254 A
const TAU = (1.5e-7 * (R + 0.3)) / (KT * KT); // 65.5 ms
const I_AVAIL = Math.min(0.2 / 0.3, 0.5); // 0.5 A
const C_BULK = ((I_START - I_AVAIL) * TAU) / 0.2; // 0.336 F

interface CheckBody {
  id: string;
  ok: boolean;
  severity?: string;
  value: number;
  limit: number;
  unit: string;
  note: string;
}
const checkOf = (body: { checks: CheckBody[] }, id: string): CheckBody | undefined => body.checks.find((c) => c.id === id);

describe('POST /api/calc/supply: the contract example', () => {
  it('answers the figures of the formulas', async () => {
    const res = await post(EXAMPLE);
    expect(res.status).toBe(200);
    expect(res.body.startCurrentA).toBeCloseTo(I_START, 6);
    expect(res.body.startCurrentA).toBeCloseTo(1.5254, 4); // docs/engineering.md §3.5 table
    expect(res.body.startActualCurrentA).toBeCloseTo(0.5, 9); // the 0.5 A port holds it
    expect(res.body.sourceVoltageAtStartV).toBeCloseTo(0.5 * R, 6); // 0.8333 V
    expect(res.body.startTorqueNm).toBeCloseTo(KT * (0.5 - 0.2), 9); // 0.6366 mN·m
    expect(res.body.startTorqueNm / (KT * (1.8 - 0.2))).toBeCloseTo(0.1875, 4); // 18.75 % of the model stall torque
    expect(res.body.runningCurrentA).toBeCloseTo(0.2 + 0.0003 / KT, 6); // 0.3414 A
    expect(TAU).toBeCloseTo(0.06551, 4); // sanity of the hand figure against §3.5's 65.51 ms
    expect(res.body.bulkCapacitanceF).toBeCloseTo(C_BULK, 5);
    expect(res.body.bulkCapacitanceF).toBeGreaterThanOrEqual(0.1); // tenths of a farad: not practical
    expect(res.body.notes.join(' ')).toMatch(/not practical/);
  });

  it('judges the three checks: running passes, the limited start is marginal (0.637 > 0.3 mN·m), the shared rail fails (0.833 < 2.7 V)', async () => {
    const res = await post(EXAMPLE);
    expect(res.body.checks.map((c: CheckBody) => c.id).sort()).toEqual([
      'logic-brownout',
      'supply-running-current',
      'supply-start-current',
    ]);
    expect(checkOf(res.body, 'supply-running-current')).toMatchObject({ ok: true, limit: 1.0, unit: 'A' });
    expect(checkOf(res.body, 'supply-start-current')).toMatchObject({ ok: false, severity: 'margin', limit: 0.5, unit: 'A' });
    expect(checkOf(res.body, 'supply-start-current')!.value).toBeCloseTo(I_START, 6);
    expect(checkOf(res.body, 'logic-brownout')).toMatchObject({ ok: false, severity: 'hard', limit: 2.7, unit: 'V' });
    expect(res.body.verdict).toBe('fail');
    // the remedies the notes name: a separate supply, a soft start by a PWM ramp
    const notes = res.body.notes.join(' ');
    expect(notes).toMatch(/supply of its own|separate supply/);
    expect(notes).toMatch(/PWM ramp/);
  });

  it('a 1.0 mN·m load on the 0.5 A port never starts: fail, and the break-away current I0 + T/Kt is named', async () => {
    const res = await post({ ...EXAMPLE, loadTorqueNm: 0.001 });
    expect(checkOf(res.body, 'supply-start-current')).toMatchObject({ ok: false, severity: 'hard' });
    const breakAwayA = 0.2 + 0.001 / KT; // 0.671 A
    expect(checkOf(res.body, 'supply-start-current')!.note).toContain(`${Number(breakAwayA.toPrecision(3))} A`);
  });

  it('only motor and supply.voltageV: no checks, no capacitor, R_int 0 (so I_start = V/R = 1.8 A)', async () => {
    const res = await post({ motor: MOTOR_M1, supply: { voltageV: 3 } });
    expect(res.status).toBe(200);
    expect(res.body.checks).toEqual([]);
    expect(res.body.verdict).toBe('pass');
    expect(res.body.bulkCapacitanceF).toBeNull();
    expect(res.body.startCurrentA).toBeCloseTo(1.8, 9);
  });
});

describe('POST /api/calc/supply: bad input is a 400 naming the field', () => {
  const without = (path: string[]): unknown => {
    const body = structuredClone(EXAMPLE) as Record<string, unknown>;
    let at = body;
    for (const key of path.slice(0, -1)) at = at[key] as Record<string, unknown>;
    delete at[path[path.length - 1]];
    return body;
  };
  const withValue = (path: string[], value: unknown): unknown => {
    const body = structuredClone(EXAMPLE) as Record<string, unknown>;
    let at = body;
    for (const key of path.slice(0, -1)) at = at[key] as Record<string, unknown>;
    at[path[path.length - 1]] = value;
    return body;
  };

  it.each([
    ['missing motor', without(['motor']), 'motor'],
    ['missing supply', without(['supply']), 'supply'],
    ['missing supply voltage', without(['supply', 'voltageV']), 'supply.voltageV'],
    ['missing stall current', without(['motor', 'stallCurrentA']), 'motor.stallCurrentA'],
    ['zero supply voltage', withValue(['supply', 'voltageV'], 0), 'supply.voltageV'],
    ['negative supply voltage', withValue(['supply', 'voltageV'], -3), 'supply.voltageV'],
    ['negative internal resistance', withValue(['supply', 'internalResistanceOhm'], -0.1), 'supply.internalResistanceOhm'],
    ['zero current limit', withValue(['supply', 'currentLimitA'], 0), 'supply.currentLimitA'],
    ['negative continuous rating', withValue(['supply', 'continuousCurrentA'], -1), 'supply.continuousCurrentA'],
    ['negative series resistance', withValue(['seriesResistanceOhm'], -0.5), 'seriesResistanceOhm'],
    ['negative load torque', withValue(['loadTorqueNm'], -0.001), 'loadTorqueNm'],
    ['negative rotor inertia', withValue(['motor', 'rotorInertiaKgM2'], -1e-7), 'motor.rotorInertiaKgM2'],
    ['negative no-load speed', withValue(['motor', 'noLoadSpeedRpm'], -12000), 'motor.noLoadSpeedRpm'],
    ['negative regulator dropout', withValue(['logic', 'regulatorDropoutV'], -0.2), 'logic.regulatorDropoutV'],
    ['zero controller minimum', withValue(['logic', 'minSupplyV'], 0), 'logic.minSupplyV'],
    ['winding above 200 °C', withValue(['windingC'], 300), 'windingC'],
    ['voltage as text', withValue(['supply', 'voltageV'], '3'), 'supply.voltageV'],
    ['current limit as text', withValue(['supply', 'currentLimitA'], 'half an amp'), 'supply.currentLimitA'],
    ['sharedWithMotor not a boolean', withValue(['logic', 'sharedWithMotor'], 'yes'), 'logic.sharedWithMotor'],
    ['winding temperature as an object', withValue(['windingC'], { c: 20 }), 'windingC'],
    ['no-load current at or above the stall current (min > max)', withValue(['motor', 'noLoadCurrentA'], 1.8), 'motor.noLoadCurrentA'],
    ['allowed dip at or above the supply (min > max)', withValue(['allowedDipV'], 3.0), 'allowedDipV'],
  ])('%s', async (_name, body, path) => {
    const res = await post(body);
    expect(res.status).toBe(400);
    expect(typeof res.body.error).toBe('string');
    expect(res.body.issues.map((i: { path: string }) => i.path)).toContain(path);
    for (const issue of res.body.issues) expect(typeof issue.message).toBe('string');
  });

  it('a body that is not an object is a 400 too', async () => {
    for (const body of [[1, 2], 'motor', 42, null]) {
      const res = await post(body);
      expect(res.status).toBe(400);
      expect(Array.isArray(res.body.issues)).toBe(true);
    }
  });

  it('415 for a non-JSON content type; 400 for broken JSON', async () => {
    // A same-origin Origin header, as a browser sends: without it Astro's CSRF origin check answers 403 first.
    const text = await api()
      .post('/api/calc/supply')
      .set('Origin', appUrl())
      .set('Content-Type', 'text/plain')
      .send(JSON.stringify(EXAMPLE));
    expect(text.status).toBe(415);
    expect(text.body.issues[0].path).toBe('(headers).content-type');
    const form = await api()
      .post('/api/calc/supply')
      .set('Origin', appUrl())
      .set('Content-Type', 'application/x-www-form-urlencoded')
      .send('motor=1');
    expect(form.status).toBe(415);
    const broken = await api().post('/api/calc/supply').set('Content-Type', 'application/json').send('{"motor":');
    expect(broken.status).toBe(400);
    expect(broken.body.error).toMatch(/JSON/);
  });
});

describe('POST /api/calc/supply: random bodies never give a 5xx', () => {
  // Numbers of every kind, including the extremes and the wrong types, in and out of the right shape.
  const value = fc.oneof(
    fc.double({ noNaN: true, noDefaultInfinity: true }),
    fc.double({ min: 1e-9, max: 1e4, noNaN: true }),
    fc.integer({ min: -5, max: 5 }),
    fc.constantFrom(0, -0, 1e308, 5e-324, null, true, '3', ''),
    fc.string({ maxLength: 4 }),
  );
  const maybe = <T>(arb: fc.Arbitrary<T>) => fc.option(arb, { nil: undefined });
  const shaped = fc.record({
    motor: maybe(
      fc.record({
        ratedVoltageV: maybe(value),
        noLoadSpeedRpm: maybe(value),
        noLoadCurrentA: maybe(value),
        stallCurrentA: maybe(value),
        stallTorqueNm: maybe(value),
        rotorInertiaKgM2: maybe(value),
      }),
    ),
    supply: maybe(
      fc.record({
        voltageV: maybe(value),
        internalResistanceOhm: maybe(value),
        continuousCurrentA: maybe(value),
        currentLimitA: maybe(value),
      }),
    ),
    seriesResistanceOhm: maybe(value),
    windingC: maybe(value),
    loadTorqueNm: maybe(value),
    allowedDipV: maybe(value),
    logic: maybe(
      fc.oneof(
        fc.record({ sharedWithMotor: maybe(fc.oneof(fc.boolean(), value)), minSupplyV: maybe(value), regulatorDropoutV: maybe(value) }),
        value,
      ),
    ),
  });

  // The contract example with one or two fields replaced: mostly valid bodies, so the 200 path is exercised too.
  const FIELDS = [
    ['motor', 'ratedVoltageV'],
    ['motor', 'noLoadSpeedRpm'],
    ['motor', 'noLoadCurrentA'],
    ['motor', 'stallCurrentA'],
    ['motor', 'rotorInertiaKgM2'],
    ['supply', 'voltageV'],
    ['supply', 'internalResistanceOhm'],
    ['supply', 'continuousCurrentA'],
    ['supply', 'currentLimitA'],
    ['logic', 'minSupplyV'],
    ['logic', 'regulatorDropoutV'],
    ['seriesResistanceOhm'],
    ['windingC'],
    ['loadTorqueNm'],
    ['allowedDipV'],
  ];
  const nearExample = fc.array(fc.tuple(fc.constantFrom(...FIELDS), value), { minLength: 1, maxLength: 2 }).map((changes) => {
    const body = structuredClone(EXAMPLE) as Record<string, unknown>;
    for (const [path, v] of changes) {
      const at = path.length === 2 ? (body[path[0]] as Record<string, unknown>) : body;
      at[path[path.length - 1]] = v;
    }
    return body;
  });

  it('answers 200 with finite figures, or 400 with the error shape (or 429 when rate limited)', async () => {
    let answered200 = 0;
    await fc.assert(
      fc.asyncProperty(fc.oneof(nearExample, nearExample, shaped, fc.anything()), async (body) => {
        const res = await post(body);
        expect(res.status).toBeLessThan(500);
        expect([200, 400, 429]).toContain(res.status);
        if (res.status === 200) {
          answered200 += 1;
          for (const key of ['startCurrentA', 'startActualCurrentA', 'sourceVoltageAtStartV', 'startTorqueNm', 'runningCurrentA']) {
            expect(Number.isFinite(res.body[key])).toBe(true);
          }
          expect(['pass', 'marginal', 'fail']).toContain(res.body.verdict);
        } else {
          expect(typeof res.body.error).toBe('string');
          expect(Array.isArray(res.body.issues)).toBe(true);
        }
      }),
      { numRuns: 120 },
    );
    expect(answered200).toBeGreaterThan(0); // the property did reach the computation
  }, 120_000);
});
