/**
 * The readiness rule, row by row, on hand-made matches. Expected outcomes are a hand-written table of the
 * sign-off rule (issue 9 item 7 and docs/engineering.md §10.3 "Unexpected start is a fail"): a pick holds when it
 * passes, or is marginal only on margins, and is approved; a motor that can run at reset refuses the
 * design unless the designer recorded why; a failing supply refuses it. Not derived from the code.
 */
import { describe, expect, it } from 'vitest';
import type { Check } from '../../src/lib/checks.ts';
import type { DesignInput } from '../../src/lib/domain/design.ts';
import type { DesignMatch } from '../../src/lib/design-match.ts';
import type { PowerOnResult } from '../../src/lib/power-on.ts';
import { acceptedResetStart, motorStateAtReset, pickStatus, readinessIssues } from '../../src/lib/readiness.ts';
import { demoDesigns } from '../../db/seeds/designs.ts';

const ok = (id: string): Check => ({ id, ok: true, value: 1, limit: 2, unit: '', margin: 0.5, note: `${id} holds` });
const hard = (id: string, note: string): Check => ({ id, ok: false, value: 3, limit: 2, unit: '', margin: -0.5, note, severity: 'hard' });
const margin = (id: string, note: string): Check => ({
  id,
  ok: false,
  value: 1.9,
  limit: 2,
  unit: '',
  margin: 0.05,
  note,
  severity: 'margin',
});

type E = DesignMatch['switch'][number];
function entry(partId: number, mpn: string, verdict: E['verdict'], checks: Check[], extra: Partial<E> = {}): E {
  return {
    partId,
    mpn,
    manufacturer: 'Invented Maker',
    verdict,
    score: 50,
    checks,
    package: 'SOT-23',
    lifecycle: 'active',
    reviewStatus: 'approved',
    priceAtQty: null,
    ...extra,
  } as E;
}

/** A diode entry: the same fields plus the part's own figures (invented). */
const asDiode = (e: E): DesignMatch['diode'][number] => ({
  ...e,
  diode: { kind: 'schottky', vrrmV: 40, ifAvA: 1, vfV: 0.45, trrNs: null },
});

const OFF_WALK: PowerOnResult = {
  steps: [{ stage: 'motor', state: 'off', minV: null, maxV: null, note: 'off' }],
  motorCanStart: false,
  note: 'The gate is held low through reset: the motor stays off.',
  recommendedPull: null,
  motorStateAtReset: 'off',
  withRecommendedPull: null,
  pullDrawWhenHighA: 0,
};
const RUNS_NO_FIX: PowerOnResult = {
  steps: [{ stage: 'motor', state: 'on', minV: null, maxV: null, note: 'on' }],
  motorCanStart: true,
  note: 'The gate is driven high at reset: the motor starts as soon as power is applied.',
  recommendedPull: {
    to: 'down',
    railV: 0,
    tolerance: 0.01,
    maxOhms: null,
    minOhms: null,
    chosenOhms: null,
    nodeV: null,
    activeCurrentA: null,
    ok: false,
    notes: ['no value holds'],
  },
  motorStateAtReset: 'on',
  withRecommendedPull: null,
  pullDrawWhenHighA: 0,
};
const RUNS_PULL_FITS: PowerOnResult = {
  ...RUNS_NO_FIX,
  recommendedPull: {
    to: 'down',
    railV: 0,
    tolerance: 0.01,
    maxOhms: 12_000,
    minOhms: 1_000,
    chosenOhms: 10_000,
    nodeV: 0.6,
    activeCurrentA: 0.0003,
    ok: true,
    notes: [],
  },
  withRecommendedPull: { steps: [], motorState: 'off' },
};

function match(over: Partial<DesignMatch> = {}): DesignMatch {
  return {
    switch: [entry(11, 'QX11', 'pass', [ok('drain-voltage'), ok('junction')]), entry(12, 'QX12', 'pass', [ok('junction')])],
    switchWithDriver: [],
    driverNeeded: false,
    driver: [],
    diode: [entry(31, 'DX31', 'pass', [ok('reverse-voltage')])],
    powerOn: OFF_WALK,
    supply: null,
    ...over,
  } as DesignMatch;
}

const { motorMpn: _m, ready: _r, ...fan } = demoDesigns[1];
function input(over: Partial<DesignInput> = {}, selections: Partial<DesignInput['selections']> = {}): DesignInput {
  return {
    ...fan,
    motor: { source: 'catalogue', partId: 1 },
    selections: {
      switch: { chosenPartId: 11, alternatePartIds: [12] },
      driver: { chosenPartId: null, alternatePartIds: [] },
      diode: { chosenPartId: 31, alternatePartIds: [] },
      ...selections,
    },
    ...over,
  };
}

const paths = (issues: { path: string }[]) => issues.map((i) => i.path);

describe('readiness rule (hand-written table of the sign-off rule)', () => {
  it('holds when every pick passes, is approved and the motor stays off', () => {
    expect(readinessIssues(input(), match())).toEqual([]);
  });

  it('a chosen part marginal only on margins holds', () => {
    const m = match({
      switch: [
        entry(11, 'QX11', 'marginal', [ok('drain-voltage'), margin('junction', 'Tj 2 K short of the target')]),
        entry(12, 'QX12', 'pass', []),
      ],
    });
    expect(readinessIssues(input(), m)).toEqual([]);
  });

  it('an alternate marginal only on margins holds too (alternates judged like chosen parts)', () => {
    const m = match({ switch: [entry(11, 'QX11', 'pass', []), entry(12, 'QX12', 'marginal', [margin('junction', 'short margin')])] });
    expect(readinessIssues(input(), m)).toEqual([]);
  });

  it('marginal with a hard fail among its checks is refused, naming the pick, the check and its note', () => {
    const m = match({
      switch: [
        entry(11, 'QX11', 'marginal', [margin('junction', 'short'), hard('stall-thermal', 'Tj reaches 450 °C at a jam')]),
        entry(12, 'QX12', 'pass', []),
      ],
    });
    const issues = readinessIssues(input(), m);
    expect(paths(issues)).toEqual(['selections.switch.chosenPartId']);
    expect(issues[0].message).toBe('QX11 fails junction temperature, jammed shaft: Tj reaches 450 °C at a jam');
  });

  it('a failing alternate is refused at its own path', () => {
    const m = match({
      switch: [entry(11, 'QX11', 'pass', []), entry(12, 'QX12', 'fail', [hard('drain-voltage', '30 V exceeds the derated 24 V')])],
    });
    const issues = readinessIssues(input(), m);
    expect(paths(issues)).toEqual(['selections.switch.alternatePartIds.0']);
    expect(issues[0].message).toMatch(/^QX12 fails drain voltage rating: .*30 V exceeds the derated 24 V/);
  });

  it('a pending part (match run with pending parts) is refused', () => {
    const m = match({ diode: [asDiode(entry(31, 'DX31', 'pass', [], { reviewStatus: 'pending' }))] });
    const issues = readinessIssues(input(), m);
    expect(paths(issues)).toEqual(['selections.diode.chosenPartId']);
    expect(issues[0].message).toBe('DX31 is pending review — not approved');
  });

  it('a pick that is no longer a candidate is refused, with the catalogue reason when known', () => {
    const parts = new Map([[12, { mpn: 'QX12', lifecycle: 'obsolete' as const, reviewStatus: 'approved' as const }]]);
    const m = match({ switch: [entry(11, 'QX11', 'pass', [])] });
    const issues = readinessIssues(input(), m, { parts });
    expect(issues).toEqual([
      { path: 'selections.switch.alternatePartIds.0', message: 'QX12 is not among the current candidates: it is obsolete' },
    ]);
  });

  it('a missing switch or diode is refused; a driver only when the match uses one', () => {
    const none = { chosenPartId: null, alternatePartIds: [] };
    expect(paths(readinessIssues(input({}, { switch: none, diode: none }), match({ powerOn: null })))).toEqual([
      'selections.switch.chosenPartId',
      'selections.diode.chosenPartId',
    ]);
    const withDriver = match({
      driverNeeded: true,
      switchWithDriver: [entry(11, 'QX11', 'pass', []), entry(12, 'QX12', 'pass', [])],
      driver: [entry(21, 'UX21', 'pass', []) as never],
    });
    expect(paths(readinessIssues(input(), withDriver))).toEqual(['selections.driver.chosenPartId']);
    expect(readinessIssues(input({}, { driver: { chosenPartId: 21, alternatePartIds: [] } }), withDriver)).toEqual([]);
  });

  it('behind a driver, switches are judged from the driver-driven list, not the direct one', () => {
    const m = match({
      driverNeeded: true,
      switch: [
        entry(11, 'QX11', 'fail', [hard('gate-drive', 'logic high below spec VGS')]),
        entry(12, 'QX12', 'fail', [hard('gate-drive', 'x')]),
      ],
      switchWithDriver: [entry(11, 'QX11', 'pass', []), entry(12, 'QX12', 'pass', [])],
      driver: [entry(21, 'UX21', 'pass', []) as never],
    });
    expect(readinessIssues(input({}, { driver: { chosenPartId: 21, alternatePartIds: [] } }), m)).toEqual([]);
  });

  it('a driver on a direct-drive design is refused: nothing judged it', () => {
    const issues = readinessIssues(input({}, { driver: { chosenPartId: 21, alternatePartIds: [] } }), match());
    expect(paths(issues)).toEqual(['selections.driver.chosenPartId']);
  });

  it('a motor that starts at reset is refused unless the intent is recorded', () => {
    const m = match({ powerOn: RUNS_NO_FIX });
    const refused = readinessIssues(input(), m);
    expect(paths(refused)).toEqual(['resetStartIntent']);
    expect(refused[0].message).toMatch(/starts at power-up or reset/);
    const reason = 'The conveyor must run from power-up; the guard interlock cuts the supply.';
    expect(readinessIssues(input({ resetStartIntent: { reason } }), m)).toEqual([]);
    expect(acceptedResetStart(input({ resetStartIntent: { reason } }), m)).toBe(reason);
    expect(acceptedResetStart(input({ resetStartIntent: { reason } }), match())).toBeNull();
  });

  it('a recommended pull that fits holds the motor off; the re-walk with the pull fitted wins when given', () => {
    expect(motorStateAtReset(RUNS_PULL_FITS)).toBe('off');
    expect(readinessIssues(input(), match({ powerOn: RUNS_PULL_FITS }))).toEqual([]);
    const reWalked = { ...RUNS_PULL_FITS, withRecommendedPull: { steps: [], motorState: 'may-run' as const } };
    expect(motorStateAtReset(reWalked)).toBe('may-run');
    expect(paths(readinessIssues(input(), match({ powerOn: reWalked })))).toEqual(['resetStartIntent']);
  });

  it('a supply report that fails is refused; marginal is not', () => {
    const supply = (verdict: 'fail' | 'marginal', checks: Check[]) => ({
      verdict,
      checks,
      startCurrentA: 3,
      startActualCurrentA: 3,
      sourceVoltageAtStartV: 4,
      startTorqueNm: 0.01,
      runningCurrentA: 1,
      bulkCapacitanceF: null,
      notes: [],
    });
    const failing = readinessIssues(
      input(),
      match({ supply: supply('fail', [hard('logic-brownout', 'the rail dips to 2.1 V at start')]) }),
    );
    expect(failing).toEqual([
      { path: 'supply', message: 'the supply fails shared controller rail at start (brown-out): the rail dips to 2.1 V at start' },
    ]);
    expect(readinessIssues(input(), match({ supply: supply('marginal', [margin('supply-start-current', 'close')]) }))).toEqual([]);
  });

  it('an obsolete or unapproved catalogue motor is refused', () => {
    expect(readinessIssues(input(), match(), { motor: { mpn: 'MX1', lifecycle: 'obsolete', reviewStatus: 'approved' } })).toEqual([
      { path: 'motor.partId', message: 'the motor MX1 is obsolete' },
    ]);
    expect(paths(readinessIssues(input(), match(), { motor: { mpn: 'MX1', lifecycle: 'active', reviewStatus: 'pending' } }))).toEqual([
      'motor.partId',
    ]);
  });
});

describe('pick status for BOM and shortlist lines (hand-written table)', () => {
  it.each([
    ['pass, approved', entry(11, 'QX11', 'pass', []), '✓ pass · approved', true],
    ['marginal on a margin', entry(11, 'QX11', 'marginal', [margin('junction', 'm')]), '! marginal (margin: junction) · approved', true],
    ['fail', entry(11, 'QX11', 'fail', [hard('stall-thermal', 'hot')]), '✕ fail (junction temperature, jammed shaft) · approved', false],
    ['pending', entry(11, 'QX11', 'pass', [], { reviewStatus: 'pending' }), '✓ pass · pending review — not approved', false],
  ] as const)('%s', (_name, e, text, holds) => {
    const s = pickStatus(match({ switch: [e] }), 'switch', 11);
    expect(s.text).toBe(text);
    expect(s.holds).toBe(holds);
  });

  it('a pick left out of the candidates does not hold', () => {
    const s = pickStatus(match(), 'switch', 99, { mpn: 'QX99', lifecycle: 'obsolete', reviewStatus: 'approved' });
    expect(s).toEqual({
      verdict: null,
      reviewStatus: 'approved',
      holds: false,
      text: '✕ QX99 is not among the current candidates: it is obsolete',
    });
  });
});
