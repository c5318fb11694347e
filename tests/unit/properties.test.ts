import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { VERDICT_RANK } from '../../src/lib/checks.ts';
import type { MosfetParams } from '../../src/lib/domain/parts.ts';
import { motorAtSupply, motorModelFromDatasheet } from '../../src/lib/motor.ts';
import { motorCurve, operatingPointAtTorque } from '../../src/lib/motor-curve.ts';
import { rankSwitchCandidates } from '../../src/lib/ranking.ts';
import { caseM1, mosfetPart } from './fixtures.ts';

const num = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });

/** Plausible small-motor datasheet points: stall current a multiple of the no-load current. */
const motorPoints = fc
  .record({ ratedVoltageV: num(1.5, 48), noLoadSpeedRpm: num(500, 40000), noLoadCurrentA: num(0.005, 2), stallRatio: num(1.5, 200) })
  .map(({ stallRatio, ...p }) => ({ ...p, stallCurrentA: p.noLoadCurrentA * stallRatio, stallTorqueNm: 0.01 }));

describe('motor model properties', () => {
  it('outputs are finite; speed falls and current rises with torque', () => {
    fc.assert(
      fc.property(motorPoints, num(0, 1), num(0, 1), (points, f1, f2) => {
        const at = motorAtSupply(motorModelFromDatasheet(points), points.ratedVoltageV);
        const [lo, hi] = [Math.min(f1, f2), Math.max(f1, f2)];
        const a = operatingPointAtTorque(at, lo * at.stallTorqueNm);
        const b = operatingPointAtTorque(at, hi * at.stallTorqueNm);
        for (const p of [a, b]) {
          for (const v of [p.torqueNm, p.speedRpm, p.currentA, p.powerW, p.efficiency]) expect(Number.isFinite(v)).toBe(true);
          expect(p.efficiency).toBeLessThanOrEqual(1);
        }
        expect(b.speedRpm).toBeLessThanOrEqual(a.speedRpm + 1e-9 * points.noLoadSpeedRpm);
        expect(b.currentA).toBeGreaterThanOrEqual(a.currentA - 1e-12 * points.stallCurrentA);
      }),
    );
  });

  it('re-scaling to the rated voltage is the identity', () => {
    fc.assert(
      fc.property(motorPoints, (points) => {
        const at = motorAtSupply(motorModelFromDatasheet(points), points.ratedVoltageV, 0);
        expect(at.noLoadSpeedRpm).toBeCloseTo(points.noLoadSpeedRpm, 6);
        expect(at.stallCurrentA / points.stallCurrentA).toBeCloseTo(1, 12);
      }),
    );
  });

  it('curves are finite and monotone point to point', () => {
    fc.assert(
      fc.property(motorPoints, num(0, 3), (points, supplyFactor) => {
        const curve = motorCurve(motorAtSupply(motorModelFromDatasheet(points), points.ratedVoltageV * supplyFactor), 11);
        curve.forEach((p, i) => {
          expect(Number.isFinite(p.speedRpm) && Number.isFinite(p.currentA)).toBe(true);
          if (i > 0) expect(p.speedRpm).toBeLessThanOrEqual(curve[i - 1].speedRpm + 1e-6);
        });
      }),
    );
  });
});

const mosfetParams: fc.Arbitrary<Partial<MosfetParams>> = fc.record({
  channel: fc.constantFrom('n' as const, 'n' as const, 'p' as const),
  vdsMaxV: num(3, 100),
  vgsMaxV: num(5, 25),
  vgsThMinV: num(0.3, 1.5),
  vgsThMaxV: num(0.8, 4.5),
  idPulsedA: num(0.5, 50),
  qgTotalNc: num(0.5, 50),
  rthJaCPerW: num(40, 500),
  tjMaxC: fc.constantFrom(125, 150, 175),
  rdsOn: fc.array(
    fc.record({
      vgsV: fc.constantFrom(1.8, 2.5, 4.5, 10),
      tjC: fc.constant(25),
      maxOhm: num(0.005, 2),
      typOhm: fc.constant(null),
      idA: fc.constant(null),
    }),
    { minLength: 0, maxLength: 3 },
  ),
});

describe('ranking properties', () => {
  it('never puts a fail above a pass, and every pass has all checks ok', () => {
    fc.assert(
      fc.property(
        fc.array(mosfetParams, { minLength: 1, maxLength: 8 }),
        fc.constantFrom('onoff', 'pwm'),
        num(2.5, 5),
        (params, mode, supplyMaxV) => {
          const c = caseM1({
            supplyMaxV,
            drive: mode === 'onoff' ? { mode: 'onoff' } : { mode: 'pwm', frequencyHz: 20000, dutyMin: 0.3, dutyMax: 0.9 },
          });
          const ranked = rankSwitchCandidates(
            c,
            params.map((p, i) => mosfetPart(i + 1, `INV-R${i}`, p)),
          );
          ranked.forEach((r, i) => {
            if (i > 0) expect(VERDICT_RANK[r.verdict]).toBeGreaterThanOrEqual(VERDICT_RANK[ranked[i - 1].verdict]);
            if (r.verdict === 'pass') expect(r.checks.every((x) => x.ok)).toBe(true);
            if (r.verdict === 'fail') expect(r.checks.some((x) => !x.ok && x.severity === 'hard')).toBe(true);
            expect(Number.isFinite(r.score)).toBe(true);
          });
        },
      ),
      { numRuns: 200 },
    );
  });
});
