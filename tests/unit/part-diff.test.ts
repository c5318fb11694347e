/**
 * The part history's words (src/lib/part-diff.ts): grouped lines in datasheet units. Expected strings are
 * written by hand from the two snapshots of each row (32 mΩ = 0.032 Ω, 250 µA = 0.00025 A).
 */
import { describe, expect, it } from 'vitest';
import { describePartChanges } from '../../src/lib/part-diff.ts';
import type { Part, PartOf } from '../../src/lib/domain/parts.ts';

const mosfet: PartOf<'mosfet'> = {
  id: 5,
  version: 3,
  category: 'mosfet',
  manufacturer: 'Marrowfield Microelectronics',
  mpn: 'MQN-TEST-1',
  description: 'Test N-channel MOSFET',
  package: 'SOT-23',
  lifecycle: 'active',
  lifecycleEffectiveDate: null,
  reviewStatus: 'pending',
  params: {
    channel: 'n',
    vdsMaxV: 30,
    vgsMaxV: 12,
    vgsThMinV: 0.5,
    vgsThMaxV: 1,
    vgsThTestCurrentA: 0.00025,
    idContinuousA: 2.4,
    idPulsedA: 11,
    qgTotalNc: 4.6,
    qgTestVgsV: 4.5,
    qgsNc: 0.73,
    qgdNc: 1.2,
    vPlateauV: 1.5,
    rthJaCPerW: 260,
    tjMaxC: 150,
    bodyDiodeVfV: 0.8,
    zthPoints: [],
    rdsOn: [
      { vgsV: 4.5, tjC: 25, maxOhm: 0.02, typOhm: 0.016, idA: 2.5 },
      { vgsV: 1.8, tjC: 25, maxOhm: 0.11, typOhm: null, idA: null },
    ],
  },
  sources: [
    {
      id: 91,
      distributor: 'Fenwick Row Electronics',
      sku: 'FRE-1',
      moq: 1,
      orderMultiple: 1,
      leadTimeDays: 5,
      stockQty: 100,
      currency: 'USD',
      priceBreaks: [
        { qty: 1, unitPrice: 0.3 },
        { qty: 100, unitPrice: 0.12 },
      ],
    },
  ],
};
const edit = (patch: (p: PartOf<'mosfet'>) => void): Part => {
  const copy = structuredClone(mosfet);
  patch(copy);
  return copy;
};

describe('describePartChanges', () => {
  it('the same record (new version, new source row ids) changes nothing', () => {
    expect(
      describePartChanges(
        mosfet,
        edit((p) => {
          p.version = 4;
          p.sources[0].id = 92;
        }),
      ),
    ).toEqual([]);
  });

  it.each<[string, (p: PartOf<'mosfet'>) => void, ReturnType<typeof describePartChanges>]>([
    [
      'one RDS(on) line added is one line, not a list of fields',
      (p) => p.params.rdsOn.push({ vgsV: 2.5, tjC: 25, maxOhm: 0.032, typOhm: null, idA: null }),
      [{ title: 'Parameters', lines: ['added RDS(on) line 32 mΩ at 2.5 V, 25 °C'] }],
    ],
    [
      'a removed line with its typical and test current',
      (p) => p.params.rdsOn.shift(),
      [{ title: 'Parameters', lines: ['removed RDS(on) line 20 mΩ at 4.5 V, 25 °C (typ. 16 mΩ), ID 2.5 A'] }],
    ],
    [
      'a line corrected in place',
      (p) => (p.params.rdsOn[0].maxOhm = 0.045),
      [{ title: 'Parameters', lines: ['RDS(on) at 4.5 V, 25 °C: max 20 mΩ → 45 mΩ'] }],
    ],
    [
      'scalar ratings in their datasheet units',
      (p) => {
        p.params.vdsMaxV = 40;
        p.params.vgsThTestCurrentA = 0.001;
        p.params.qgdNc = null;
      },
      [{ title: 'Parameters', lines: ['VDS max 30 V → 40 V', 'VGS(th) test current 250 µA → 1000 µA', 'Qgd 1.2 nC → —'] }],
    ],
    [
      'the record, review and lifecycle in words',
      (p) => {
        p.package = 'SOT-23-3';
        p.reviewStatus = 'approved';
        p.lifecycle = 'nrnd';
        p.lifecycleEffectiveDate = '2027-01-01';
      },
      [
        {
          title: 'Record',
          lines: [
            'Package SOT-23 → SOT-23-3',
            'Review Pending review → Approved',
            'Lifecycle Active → Not recommended for new designs (NRND)',
            'Lifecycle effective — → 2027-01-01',
          ],
        },
      ],
    ],
    [
      'a Zth curve point added',
      (p) => p.params.zthPoints.push({ pulseS: 0.01, zthCPerW: 12 }),
      [{ title: 'Parameters', lines: ['added Zth point 12 K/W at 10 ms'] }],
    ],
    [
      'supply data: stock, order multiple and a price break changed, a source added',
      (p) => {
        p.sources[0].stockQty = 40;
        p.sources[0].orderMultiple = 25;
        p.sources[0].priceBreaks[1].unitPrice = 0.1;
        p.sources.push({
          distributor: 'Kelderhaus Bauteile',
          sku: 'KB-7',
          moq: 5,
          orderMultiple: 10,
          leadTimeDays: 10,
          stockQty: 30,
          currency: 'EUR',
          priceBreaks: [],
        });
      },
      [
        {
          title: 'Sources and prices',
          lines: [
            'Fenwick Row Electronics FRE-1: stock 100 → 40; order multiple 1 → 25; break 100: 0.1200 → 0.1000 USD',
            'added source Kelderhaus Bauteile KB-7: stock 30, MOQ 5, order multiple 10, lead time 10 days, prices none',
          ],
        },
      ],
    ],
    [
      'supply data: stock past a thousand, a break added and one removed, lead time (texts written by hand)',
      (p) => {
        p.sources[0].stockQty = 1240;
        p.sources[0].leadTimeDays = 1;
        p.sources[0].priceBreaks = [
          { qty: 1, unitPrice: 0.3 },
          { qty: 1000, unitPrice: 0.095 },
        ];
      },
      [
        {
          title: 'Sources and prices',
          lines: [
            'Fenwick Row Electronics FRE-1: stock 100 → 1,240; lead time 5 days → 1 day; removed break 100 (was 0.1200 USD); added break 1,000: 0.0950 USD',
          ],
        },
      ],
    ],
    [
      'supply data: a currency change restates the whole price list',
      (p) => {
        p.sources[0].currency = 'EUR';
      },
      [
        {
          title: 'Sources and prices',
          lines: [
            'Fenwick Row Electronics FRE-1: currency USD → EUR; prices 1+: 0.3000 USD · 100+: 0.1200 USD → 1+: 0.3000 EUR · 100+: 0.1200 EUR',
          ],
        },
      ],
    ],
  ])('%s', (_name, patch, expected) => {
    expect(describePartChanges(mosfet, edit(patch))).toEqual(expected);
  });

  it('motor figures in mA and mN·m; a diode trr of none reads as Schottky', () => {
    const motor: Part = {
      ...mosfet,
      category: 'motor',
      params: {
        ratedVoltageV: 6,
        voltageMinV: null,
        voltageMaxV: null,
        noLoadSpeedRpm: 9000,
        noLoadCurrentA: 0.12,
        stallTorqueNm: 0.01,
        stallCurrentA: 2,
        terminalResistanceOhm: 3,
        inductanceH: null,
        rotorInertiaKgM2: null,
      },
    };
    const faster: Part = { ...motor, params: { ...motor.params, noLoadCurrentA: 0.15, stallTorqueNm: 0.0125 } } as Part;
    expect(describePartChanges(motor, faster)).toEqual([
      { title: 'Parameters', lines: ['No-load current 120 mA → 150 mA', 'Stall torque 10 mN·m → 12.5 mN·m'] },
    ]);
    const diode = (trrNs: number | null): Part => ({
      ...mosfet,
      category: 'diode',
      params: {
        kind: 'schottky',
        vrrmV: 45,
        ifAvA: 2,
        ifsmA: 50,
        vfV: 0.55,
        vfAtIfA: 2,
        trrNs,
        ifrmA: null,
        rthJaCPerW: null,
        tjMaxC: null,
      },
    });
    expect(describePartChanges(diode(35), diode(null))).toEqual([{ title: 'Parameters', lines: ['trr 35 ns → none (Schottky)'] }]);
  });
});
