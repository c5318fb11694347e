import { describe, expect, it } from 'vitest';
import request from 'supertest';
import { appUrl } from '../helpers/stack.ts';
import { MOTOR_M1, SWITCH_BODY } from '../helpers/contract-examples.ts';

const api = () => request(appUrl());

// docs/engineering.md §2 worked example M1 (invented, self-consistent), re-derived here from the linear model:
// R = V/Is, Ke = (V − I0·R)/ω0, Ts = Ke·(Is − I0).
const M1 = MOTOR_M1;
const R = 3 / 1.8;
const omega0 = (12000 * 2 * Math.PI) / 60;
const Ke = (3 - 0.2 * R) / omega0;

describe('POST /api/calc/motor', () => {
  it('answers the contract shape with the model of M1', async () => {
    const res = await api().post('/api/calc/motor').send({ motor: M1, supplyV: 3 });
    expect(res.status).toBe(200);
    expect(res.body.resistanceOhm).toBeCloseTo(R, 4);
    expect(res.body.keVsPerRad).toBeCloseTo(Ke, 7);
    expect(res.body.ktNmPerA).toBeCloseTo(Ke, 7);
    expect(res.body.frictionTorqueNm).toBeCloseTo(Ke * 0.2, 7);
    expect(res.body.consistency.warning).toBeNull();
    expect(res.body.atSupply.maxPower.speedRpm).toBeCloseTo(6000, 3);
    expect(res.body.atSupply.maxPower.currentA).toBeCloseTo(1.0, 6); // (I0 + Is)/2
    expect(res.body.atSupply.maxEfficiency.currentA).toBeCloseTo(Math.sqrt(0.2 * 1.8), 6); // √(I0·Is)
    expect(res.body.atSupply.maxEfficiency.efficiency).toBeCloseTo((1 - Math.sqrt(0.2 / 1.8)) ** 2, 6);
    expect(res.body.curve).toHaveLength(21); // default curvePoints
    expect(res.body.curve[0]).toMatchObject({ torqueNm: 0, powerW: 0 });
  });

  it('re-scales to 4.5 V (docs/engineering.md §2.6 M1: Is 2.70 A, n0 18 750 rpm)', async () => {
    const res = await api().post('/api/calc/motor').send({ motor: M1, supplyV: 4.5, curvePoints: 5 });
    expect(res.status).toBe(200);
    expect(res.body.atSupply.stallCurrentA).toBeCloseTo(4.5 / R, 6);
    expect(res.body.atSupply.noLoadSpeedRpm).toBeCloseTo(((4.5 - 0.2 * R) / Ke) * (60 / (2 * Math.PI)), 3);
    expect(res.body.curve).toHaveLength(5);
  });

  it('warns when the datasheet torque disagrees (60 g·cm → ratio ≈ 1.733)', async () => {
    const gcmToNm = 9.80665e-5; // SI Brochure, g_n = 9.80665 m/s² exactly
    const res = await api()
      .post('/api/calc/motor')
      .send({ motor: { ...M1, stallTorqueNm: 60 * gcmToNm }, supplyV: 3 });
    expect(res.body.consistency.torqueRatio).toBeCloseTo((60 * gcmToNm) / (Ke * 1.6), 3);
    expect(typeof res.body.consistency.warning).toBe('string');
  });

  it.each([
    ['negative current', { motor: { ...M1, noLoadCurrentA: -0.1 }, supplyV: 3 }, 'motor.noLoadCurrentA'],
    ['stall below no-load', { motor: { ...M1, stallCurrentA: 0.1 }, supplyV: 3 }, 'motor.noLoadCurrentA'],
    ['missing field', { motor: { ...M1, noLoadSpeedRpm: undefined }, supplyV: 3 }, 'motor.noLoadSpeedRpm'],
    ['wrong type', { motor: M1, supplyV: 'three' }, 'supplyV'],
  ])('400 with the field named: %s', async (_name, body, path) => {
    const res = await api().post('/api/calc/motor').send(body);
    expect(res.status).toBe(400);
    expect(typeof res.body.error).toBe('string');
    expect(res.body.issues.map((i: { path: string }) => i.path)).toContain(path);
  });

  it('415 for a non-JSON body and 400 for broken JSON, never a 500', async () => {
    // A same-origin Origin header, as a browser sends: without it Astro's CSRF origin check answers 403 first.
    const text = await api().post('/api/calc/motor').set('Origin', appUrl()).set('Content-Type', 'text/plain').send('motor=1');
    expect(text.status).toBe(415);
    const broken = await api().post('/api/calc/motor').set('Content-Type', 'application/json').send('{"motor":');
    expect(broken.status).toBe(400);
    expect(broken.body.error).toMatch(/JSON/);
  });
});

describe('POST /api/calc/pull-resistor', () => {
  it('docs/engineering.md §9: 40 kΩ internal pull-up to 3.3 V, node ≤ 0.5 V → E12 6.8 kΩ, node 0.4795 V', async () => {
    const res = await api()
      .post('/api/calc/pull-resistor')
      .send({
        pin: { internalPull: 'up', internalPullOhms: 40000, railV: 3.3, maxCurrentA: 0.004 },
        external: { to: 'down', railV: 0 },
        node: { mustBe: 'low', limitV: 0.5 },
        series: 'E12',
      });
    expect(res.status).toBe(200);
    expect(res.body.chosenOhms).toBe(6800);
    // divider re-derived: V = 3.3·6.8k/(40k + 6.8k)
    expect(res.body.nodeV).toBeCloseTo((3.3 * 6800) / 46800, 4);
    expect(res.body.ok).toBe(true);
    expect(Object.keys(res.body).sort()).toEqual(['activeCurrentA', 'chosenOhms', 'maxOhms', 'minOhms', 'nodeV', 'notes', 'ok'].sort());
  });

  it('400 names an unknown series', async () => {
    const res = await api()
      .post('/api/calc/pull-resistor')
      .send({
        pin: { internalPull: 'up', internalPullOhms: 40000, railV: 3.3, maxCurrentA: 0.004 },
        external: { to: 'down', railV: 0 },
        node: { mustBe: 'low', limitV: 0.5 },
        series: 'E7',
      });
    expect(res.status).toBe(400);
    expect(res.body.issues[0].path).toBe('series');
  });
});

const SWITCH = SWITCH_BODY;

describe('POST /api/calc/switch', () => {
  it('answers the contract example with every required check id', async () => {
    const res = await api().post('/api/calc/switch').send(SWITCH);
    expect(res.status).toBe(200);
    // A jammed shaft with no protection (the default) at 3 A, full on: the steady state of
    // Tj = Ta + I²·R25·(1 + α(Tj − 25))·RθJA, solved by hand: Tj − Ta = k(1 + α(Ta − 25)) / (1 − kα) with
    // k = I²·R25·RθJA (docs/engineering.md §6.1; R25 the log-interpolated RDS(on) at 5 V worked out below).
    const r25 = Math.exp(Math.log(0.05) + ((5 - 4.5) / (10 - 4.5)) * (Math.log(0.035) - Math.log(0.05)));
    const k = 3 ** 2 * r25 * 250;
    const tjStallC = 40 + (k * (1 + 0.005 * (40 - 25))) / (1 - k * 0.005);
    expect(tjStallC).toBeGreaterThan(150);
    expect(res.body.verdict).toBe('fail');
    const failing = res.body.checks.filter((c: { ok: boolean }) => !c.ok).map((c: { id: string }) => c.id);
    expect(failing).toEqual(['stall-thermal']);
    const stall = res.body.checks.find((c: { id: string }) => c.id === 'stall-thermal');
    expect(stall.value).toBeCloseTo(tjStallC, 0);
    expect(stall.limit).toBe(150);
    const ids = res.body.checks.map((c: { id: string }) => c.id);
    for (const id of ['drain-voltage', 'gate-voltage-rating', 'gate-drive', 'stall-current', 'running-current', 'junction-temperature']) {
      expect(ids).toContain(id);
    }
    // RDS(on) at 5 V interpolated in log space (ln R linear in VGS) between (4.5 V, 50 mΩ) and (10 V, 35 mΩ),
    // computed here independently of src/lib.
    const t = (5 - 4.5) / (10 - 4.5);
    expect(res.body.rdsOnAtDriveOhms).toBeCloseTo(Math.exp(Math.log(0.05) + t * (Math.log(0.035) - Math.log(0.05))), 4);
  });

  it('fails the gate drive for a part only specified at 10 V driven from 3.3 V logic (common practice)', async () => {
    const body = structuredClone(SWITCH);
    body.mosfet.vgsThMaxV = 4;
    body.mosfet.rdsOn = [{ vgsV: 10, ohms: 0.035 }];
    body.operating.gateDriveV = 3.3;
    const res = await api().post('/api/calc/switch').send(body);
    expect(res.status).toBe(200);
    expect(res.body.verdict).toBe('fail');
    expect(res.body.checks.find((c: { id: string }) => c.id === 'gate-drive').ok).toBe(false);
  });

  it('400 for a duty outside 0–1', async () => {
    const body = structuredClone(SWITCH);
    body.operating.duty = 1.4;
    const res = await api().post('/api/calc/switch').send(body);
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path)).toContain('operating.duty');
  });
});
