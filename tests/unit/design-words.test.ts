/**
 * Words for what a design is judged at (src/lib/design-words.ts) and the driver rail's band
 * (src/lib/design-input.ts). Expected strings and numbers are written by hand from the inputs in each row.
 */
import { describe, expect, it } from 'vitest';
import type { WorstCase } from '../../src/lib/design-case.ts';
import { driverSupplyRangeOf } from '../../src/lib/design-input.ts';
import {
  bomPairingNotes,
  checkLabel,
  driversRankedForLine,
  judgedAtShort,
  motorStateText,
  rippleRows,
  stallProtectionText,
  stallRows,
  switchDriveLine,
} from '../../src/lib/design-words.ts';
import type { SwitchDrive } from '../../src/lib/rank-design.ts';

const pin: SwitchDrive = {
  by: 'pin',
  gateV: 2.9,
  sourceCurrentA: 0.008,
  driverPartId: null,
  driverMpn: null,
  provisional: false,
  pullDownDrawA: 0,
};
const provisional: SwitchDrive = {
  by: 'driver',
  gateV: 11.1,
  sourceCurrentA: 1.5,
  driverPartId: 4,
  driverMpn: 'GD-100',
  provisional: true,
  pullDownDrawA: 0,
};

describe.each([
  {
    name: 'pin, no pull-down draw',
    drive: pin,
    supplyMinV: 11.4,
    has: ['controller pin: 2.9 V gate drive', '8 mA source current'],
    not: ['pull-down'],
  },
  {
    name: 'pin, after a 0.29 mA gate pull-down draw (2.9 V / 10 kΩ)',
    drive: { ...pin, sourceCurrentA: 0.00771, pullDownDrawA: 0.00029 },
    supplyMinV: 11.4,
    has: ['7.71 mA source current', 'less the 0.29 mA the recommended gate pull-down draws'],
    not: ['driver'],
  },
  {
    name: 'provisional driver',
    drive: provisional,
    supplyMinV: 11.4,
    has: ['driver GD-100: 11.1 V gate drive', 'lowest driver supply of 11.4 V', 'provisional'],
    not: ['the chosen driver'],
  },
  {
    name: 'chosen driver',
    drive: { ...provisional, provisional: false },
    supplyMinV: 4.75,
    has: ['driver GD-100', 'lowest driver supply of 4.75 V', '(the chosen driver)'],
    not: ['provisional'],
  },
])('switchDriveLine: $name', ({ drive, supplyMinV, has, not }) => {
  it('names the drive the list is judged at', () => {
    const line = switchDriveLine(drive, supplyMinV);
    for (const h of has) expect(line).toContain(h);
    for (const n of not) expect(line).not.toContain(n);
  });
});

describe('short pairing notes for the bill of materials', () => {
  it.each([
    [pin, 'judged at 2.9 V gate drive from the controller pin'],
    [provisional, 'judged at 11.1 V gate drive from driver GD-100 (provisional, no driver chosen)'],
    [{ ...provisional, provisional: false }, 'judged at 11.1 V gate drive from driver GD-100'],
  ])('judgedAtShort %#', (drive, expected) => {
    expect(judgedAtShort(drive)).toBe(expected);
  });

  it('pairs the chosen driver with its switch, and leaves the driver out when none is chosen', () => {
    const match = {
      switchDrive: { ...provisional, provisional: false },
      driver: [
        { partId: 4, pairing: { switchMpn: 'QN-30', gateDriveV: 11.1 } },
        { partId: 5, pairing: { switchMpn: 'QN-30', gateDriveV: 9.6 } },
      ],
    };
    expect(bomPairingNotes(match, 5)).toEqual({
      switch: 'judged at 11.1 V gate drive from driver GD-100',
      driver: 'paired with switch QN-30 at 9.6 V gate drive',
    });
    expect(bomPairingNotes(match, null)).toEqual({ switch: 'judged at 11.1 V gate drive from driver GD-100' });
    expect(bomPairingNotes(match, 99)).toEqual({ switch: 'judged at 11.1 V gate drive from driver GD-100' });
  });

  it('says which switch the drivers are ranked for', () => {
    expect(driversRankedForLine('QN-30', true)).toContain('the chosen switch QN-30');
    expect(driversRankedForLine('QN-30', false)).toContain('QN-30, the best switch so far');
    expect(driversRankedForLine(null, false)).toContain('not ranked');
  });
});

describe('driver rail band', () => {
  it.each([
    // 12 V × 0.95 = 11.4 V, × 1.05 = 12.6 V; 5 V × 0.95 = 4.75 V, × 1.05 = 5.25 V (by hand)
    [12, { minV: 11.4, maxV: 12.6 }],
    [5, { minV: 4.75, maxV: 5.25 }],
  ])('a separate %d V rail is judged at ±5 %%', (railV, expected) => {
    const r = driverSupplyRangeOf({
      driverSupplyV: railV,
      supply: { minV: 6, nomV: 7.4, maxV: 8.4, preset: null, internalResistanceOhm: 0, continuousCurrentA: null, currentLimitA: null },
    });
    expect(r.minV).toBeCloseTo(expected.minV, 12);
    expect(r.maxV).toBeCloseTo(expected.maxV, 12);
  });
  it('null means the motor supply, at its own range', () => {
    expect(
      driverSupplyRangeOf({
        driverSupplyV: null,
        supply: { minV: 6, nomV: 7.4, maxV: 8.4, preset: null, internalResistanceOhm: 0, continuousCurrentA: null, currentLimitA: null },
      }),
    ).toEqual({ minV: 6, maxV: 8.4 });
  });
});

describe('stall protection and reset state in words', () => {
  it.each([
    [{ kind: 'none' as const }, 'none: a jam holds the switch on at full stall current'],
    [{ kind: 'current-limit' as const, limitA: 1.5 }, 'current limit at 1.5 A'],
    [{ kind: 'cut-off' as const, afterS: 0.5 }, 'cut-off after 0.5 s'],
  ])('%o', (p, expected) => {
    expect(stallProtectionText(p)).toContain(expected);
  });
  it.each([
    ['off', 'stays still'],
    ['on', 'runs at power-on'],
    ['may-run', 'not surely held off'],
  ] as const)('motor %s', (state, words) => {
    expect(motorStateText(state)).toContain(words);
  });
});

describe('check labels', () => {
  it.each([
    ['stall-thermal', 'Junction temperature, jammed shaft'],
    ['diode-thermal', 'Diode junction temperature'],
    ['rdson-test-current', 'RDS(on) test current'],
    ['some-new-check', 'Some new check'],
  ])('%s → %s', (id, label) => {
    expect(checkLabel(id)).toBe(label);
  });
});

/** A worst case written by hand: the docs/engineering.md §10 ripple example at 1 kHz (12.6 V, D 0.5, τe 0.5 ms). */
function worstCase(patch: Partial<WorstCase> = {}): WorstCase {
  return {
    supplyMinV: 11.4,
    supplyMaxV: 12.6,
    stallCurrentMaxA: 5.6,
    runningCurrentA: 0.745,
    switchDuty: 0.5,
    diodeMeanCurrentA: 0.2,
    switchRmsA: 0.834,
    turnOnCurrentA: 0,
    turnOffCurrentA: 1.818,
    ripple: {
      rippleA: 1.818,
      peakA: 1.818,
      continuous: false,
      zeroFraction: 0.24,
      periodsPerTau: 0.5,
      backEmfV: 5.7,
      duty: 0.5,
      supplyV: 12.6,
    },
    diodeRepetitivePeakA: 1.818,
    stall: { protection: { kind: 'current-limit', limitA: 2 }, duty: 0.9, currentA: 2, currentRmsA: 1.9, peakA: 2, diodeMeanA: 0.2 },
    gateDriveMinV: 2.9,
    gateDriveMaxV: 3.3,
    ambientMaxC: 40,
    windingColdC: 0,
    pwmHz: 1000,
    diodeForwardV: 0.7,
    ...patch,
  };
}

describe('ripple and jam figures', () => {
  it('shows the discontinuous 1 kHz case with its RMS, peak and turn-off current', () => {
    const { rows, note } = rippleRows(worstCase(), true);
    const byLabel = Object.fromEntries(rows.map((r) => [r.label, r.value]));
    expect(note).toBeNull();
    expect(byLabel['Ripple, peak to peak (duty 50 %, 12.6 V)']).toBe('1.82 A');
    expect(byLabel['Switch RMS current']).toBe('0.834 A');
    expect(byLabel['Peak current']).toBe('1.82 A');
    expect(byLabel['Switched off at']).toBe('1.82 A');
    expect(byLabel['PWM periods per τe (f·L/R)']).toBe('0.5'); // 1 kHz × 0.5 ms
    expect(byLabel.Conduction).toBe('discontinuous conduction: zero for 24 % of each period');
  });
  it('says continuous when the current never reaches zero', () => {
    const wc = worstCase({
      ripple: {
        rippleA: 0.1,
        peakA: 0.815,
        continuous: true,
        zeroFraction: 0,
        periodsPerTau: 10,
        backEmfV: 4.16,
        duty: 0.5,
        supplyV: 12.6,
      },
    });
    expect(rippleRows(wc, true).rows.find((r) => r.label === 'Conduction')?.value).toBe('continuous');
  });
  it('asks for the inductance when it is missing, and has nothing for on/off', () => {
    expect(rippleRows(worstCase({ ripple: null }), false).note).toContain('enter the motor’s inductance');
    expect(rippleRows(worstCase({ ripple: null, switchDuty: 1 }), true).note).toContain('100 % duty');
    expect(rippleRows(worstCase({ pwmHz: null, ripple: null }), false)).toEqual({ rows: [], note: 'On/off drive: no PWM ripple.' });
  });
  it('lists the jam with its protection, and the diode share only under PWM', () => {
    const rows = stallRows(worstCase());
    expect(rows.map((r) => r.value)).toEqual(['current limit 2 A', '2 A', '1.9 A', '0.2 A']);
    expect(rows[1].label).toBe('Jammed: motor current (duty 90 %)');
    expect(
      stallRows(
        worstCase({
          pwmHz: null,
          stall: { protection: { kind: 'none' }, duty: 1, currentA: 5.6, currentRmsA: 5.6, peakA: 5.6, diodeMeanA: 0 },
        }),
      ).map((r) => r.value),
    ).toEqual(['none (worst case)', '5.6 A', '5.6 A']);
  });
});
