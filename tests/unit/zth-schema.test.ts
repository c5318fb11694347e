import { describe, expect, it } from 'vitest';
import { mosfetParamsSchema, diodeParamsSchema } from '../../src/lib/schemas/parts.ts';

// An invented SOT-23 logic-level MOSFET with RθJA 250 K/W (the demo catalogue's typical SOT-23 value).
const base = {
  channel: 'n',
  vdsMaxV: 30,
  vgsMaxV: 20,
  vgsThMinV: 1,
  vgsThMaxV: 2.5,
  idContinuousA: 3,
  idPulsedA: 12,
  qgTotalNc: 5,
  qgTestVgsV: 4.5,
  rthJaCPerW: 250,
  tjMaxC: 150,
  rdsOn: [{ vgsV: 4.5, maxOhm: 0.05 }],
};
const paths = (zthPoints: unknown): string[] => {
  const r = mosfetParamsSchema.safeParse({ ...base, zthPoints });
  return r.success ? [] : r.error.issues.map((i) => i.path.join('.'));
};

// What a single-pulse Zth curve must look like (common practice, from memory): impedance rises with the
// pulse length toward the steady-state RθJA and never exceeds it; pulse lengths are distinct points.
describe('single-pulse Zth points', () => {
  it.each([
    ['none (the field may be left out)', undefined, []],
    [
      'a curve rising toward RθJA',
      [
        { pulseS: 0.001, zthCPerW: 5 },
        { pulseS: 1, zthCPerW: 135 },
        { pulseS: 100, zthCPerW: 243 },
      ],
      [],
    ],
    [
      'the last point equal to RθJA',
      [
        { pulseS: 0.01, zthCPerW: 19 },
        { pulseS: 1000, zthCPerW: 250 },
      ],
      [],
    ],
    [
      'a Zth above RθJA (250 K/W)',
      [
        { pulseS: 0.01, zthCPerW: 19 },
        { pulseS: 100, zthCPerW: 260 },
      ],
      ['zthPoints.1.zthCPerW'],
    ],
    [
      'pulses out of order',
      [
        { pulseS: 1, zthCPerW: 135 },
        { pulseS: 0.1, zthCPerW: 62 },
      ],
      ['zthPoints.1.pulseS'],
    ],
    [
      'the same pulse twice',
      [
        { pulseS: 1, zthCPerW: 135 },
        { pulseS: 1, zthCPerW: 140 },
      ],
      ['zthPoints.1.pulseS'],
    ],
    [
      'a Zth falling as the pulse lengthens',
      [
        { pulseS: 0.1, zthCPerW: 62 },
        { pulseS: 1, zthCPerW: 40 },
      ],
      ['zthPoints.1.zthCPerW'],
    ],
    ['a zero impedance', [{ pulseS: 0.1, zthCPerW: 0 }], ['zthPoints.0.zthCPerW']],
    ['a negative pulse', [{ pulseS: -0.1, zthCPerW: 10 }], ['zthPoints.0.pulseS']],
  ] as const)('%s', (_name, points, expected) => {
    expect(paths(points)).toEqual(expected);
  });
});

describe('diode thermal fields', () => {
  it('are optional and default to null (not stated)', () => {
    const r = diodeParamsSchema.parse({ kind: 'schottky', vrrmV: 40, ifAvA: 1, ifsmA: 25, vfV: 0.5, vfAtIfA: 1 });
    expect([r.ifrmA, r.rthJaCPerW, r.tjMaxC]).toEqual([null, null, null]);
  });
  it.each([
    ['a Tj max below 25 °C', { tjMaxC: 20 }, 'tjMaxC'],
    ['a Tj max above 250 °C', { tjMaxC: 300 }, 'tjMaxC'],
    ['a negative RθJA', { rthJaCPerW: -60 }, 'rthJaCPerW'],
    ['a zero IFRM', { ifrmA: 0 }, 'ifrmA'],
  ])('refuse %s', (_name, extra, field) => {
    const r = diodeParamsSchema.safeParse({ kind: 'schottky', vrrmV: 40, ifAvA: 1, ifsmA: 25, vfV: 0.5, vfAtIfA: 1, ...extra });
    expect(r.success ? [] : r.error.issues.map((i) => i.path.join('.'))).toEqual([field]);
  });
});
