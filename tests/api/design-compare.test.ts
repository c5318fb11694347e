/**
 * GET /api/designs/:id/compare against hand-computed checks of the demo AG-3 agitator (supply 22.8–25.2 V,
 * voltage derating 0.8, its saved picks) and three demo MOSFETs and two demo diodes; verdicts and checks
 * must equal the entries the design's match list gives for the same parts (a second path through the
 * match route). Bad queries answer 400 naming the field; unknown or hidden parts 404.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { appDb, appUrl } from '../helpers/stack.ts';
import { sessionCookie } from '../helpers/session.ts';
import { demoMosfets } from '../../db/seeds/data/mosfets.ts';
import { demoDiodes } from '../../db/seeds/data/diodes.ts';
import type { DesignInput } from '../../src/lib/domain/design.ts';
import type { DesignMatchPage } from '../../src/lib/match-page.ts';
import type { DesignComparison } from '../../src/server/services/design-compare.ts';

const knex = appDb();
const api = () => request(appUrl());
let designer = '';
let librarian = '';
let buyer = '';
let designId = 0;
let input: DesignInput;
const ids = new Map<string, number>();

const AG3 = 'AG-3 agitator, 24 V, 1.8 V logic through a gate driver';
/** The AG-3 seed: supply maximum 25.2 V, derating 0.8 (db/seeds/designs.ts, DEFAULT_DESIGN_MARGINS). */
const SUPPLY_MAX_V = 25.2;
const DERATING = 0.8;

const vdsOf = (mpn: string) => demoMosfets.find((m) => m.mpn === mpn)!.params.vdsMaxV;
const diodeOf = (mpn: string) => demoDiodes.find((d) => d.mpn === mpn)!.params;

beforeAll(async () => {
  [designer, librarian, buyer] = await Promise.all([sessionCookie('designer'), sessionCookie('librarian'), sessionCookie('buyer')]);
  designId = (await knex('designs').where({ name: AG3 }).first('id')).id;
  input = (await api().get(`/api/designs/${designId}`).set('Cookie', designer)).body.input;
  for (const r of await knex('parts').select('id', 'mpn')) ids.set(r.mpn, r.id);
});
afterAll(() => knex.destroy());

const compare = (query: string, cookie = designer) => api().get(`/api/designs/${designId}/compare?${query}`).set('Cookie', cookie);
const checkOf = (part: DesignComparison['parts'][number], id: string) => part.checks.find((c) => c.id === id)!;

describe('compare switches of the AG-3 agitator', () => {
  const MPNS = ['CWN60L04-S3', 'CWN30L01-S3', 'MQN20T03-C6'];
  let answer: DesignComparison;
  let match: DesignMatchPage;

  beforeAll(async () => {
    const res = await compare(`role=switch&ids=${MPNS.map((m) => ids.get(m)).join(',')}`);
    expect(res.status, res.text).toBe(200);
    answer = res.body;
    const m = await api().post(`/api/designs/${designId}/match`).set('Cookie', designer).send({ limit: 500 });
    expect(m.status).toBe(200);
    match = m.body;
  });

  it('answers one column per part, in the order asked, with every check as a row', () => {
    expect(answer.parts.map((p) => p.mpn)).toEqual(MPNS);
    const rowIds = answer.rows.map((r) => r.id);
    for (const p of answer.parts) for (const c of p.checks) expect(rowIds).toContain(c.id);
    expect(answer.rows.find((r) => r.id === 'drain-voltage')?.label).toBe('Drain voltage rating');
  });

  it('drain voltage by hand: 25.2 V plus the chosen diode’s VF against 0.8 × VDS(max)', () => {
    // The design's saved diode pick sets VF (the engine's rule: chosen diode first).
    const chosenDiode = [...ids.entries()].find(([, id]) => id === input.selections.diode.chosenPartId)![0];
    const drainV = SUPPLY_MAX_V + diodeOf(chosenDiode).vfV;
    // Hand table: 60 V → 48 V derated (pass); 30 V → 24 V derated, under 30 V raw (marginal); 20 V → below the value (fail).
    const expected: Record<string, { limit: number; verdict: string }> = {
      'CWN60L04-S3': { limit: 48, verdict: 'pass' },
      'CWN30L01-S3': { limit: 24, verdict: 'marginal' },
      'MQN20T03-C6': { limit: 16, verdict: 'fail' },
    };
    for (const p of answer.parts) {
      const c = checkOf(p, 'drain-voltage');
      expect(vdsOf(p.mpn) * DERATING).toBeCloseTo(expected[p.mpn].limit, 9);
      expect(c.value).toBeCloseTo(drainV, 9);
      expect(c.limit).toBeCloseTo(expected[p.mpn].limit, 9);
      expect(c.verdict, p.mpn).toBe(expected[p.mpn].verdict);
      expect(c.sense).toBe('at-most');
    }
    // A part failing a hard check fails as a whole (the verdict rule).
    expect(answer.parts.find((p) => p.mpn === 'MQN20T03-C6')!.verdict).toBe('fail');
  });

  it('verdicts and checks equal the match list’s entries for the same parts (second path)', () => {
    const list = match.driverNeeded ? match.switchWithDriver : match.switch;
    for (const p of answer.parts) {
      const entry = list.find((e) => e.partId === p.partId);
      if (!entry) continue;
      expect(p.rank, p.mpn).toBe(entry.rank);
      expect(p.verdict, p.mpn).toBe(entry.verdict);
      expect(p.score).toBe(entry.score);
      expect(p.checks.map((c) => [c.id, c.value, c.limit, c.reason])).toEqual(entry.checks.map((c) => [c.id, c.value, c.limit, c.note]));
    }
    // The two parts rated above the supply are ranked; the 20 V part is left out by the SQL narrowing.
    expect(list.some((e) => e.partId === ids.get('CWN60L04-S3'))).toBe(true);
    expect(list.some((e) => e.partId === ids.get('MQN20T03-C6'))).toBe(false);
    const outside = answer.parts.find((p) => p.mpn === 'MQN20T03-C6')!;
    expect(outside.rank).toBeNull();
    expect(outside.outsideRanking).toMatch(/left out/i);
  });

  it('says what the switches are judged at (the match’s own drive)', () => {
    expect(answer.judgedAt).toContain(`${match.switchDrive.gateV.toPrecision(3).replace(/\.?0+$/, '')} V`);
  });
});

describe('compare diodes of the AG-3 agitator', () => {
  it('reverse voltage by hand: 25.2 V against 0.8 × VRRM, equal to the match list', async () => {
    const mpns = ['ORS20-60-MA', 'ORS05-30-D323'];
    const res = await compare(`role=diode&ids=${mpns.map((m) => ids.get(m)).join(',')}`);
    expect(res.status, res.text).toBe(200);
    const body = res.body as DesignComparison;
    // 60 V → 48 V derated ≥ 25.2 V: holds; 30 V → 24 V derated < 25.2 V ≤ 30 V: inside the margin only.
    const hand: Record<string, { limit: number; verdict: string }> = {
      'ORS20-60-MA': { limit: 48, verdict: 'pass' },
      'ORS05-30-D323': { limit: 24, verdict: 'marginal' },
    };
    const m = (await api().post(`/api/designs/${designId}/match`).set('Cookie', designer).send({ limit: 500 })).body as DesignMatchPage;
    for (const p of body.parts) {
      expect(diodeOf(p.mpn).vrrmV * DERATING).toBeCloseTo(hand[p.mpn].limit, 9);
      const c = checkOf(p, 'reverse-voltage');
      expect(c.value).toBeCloseTo(SUPPLY_MAX_V, 9);
      expect(c.limit).toBeCloseTo(hand[p.mpn].limit, 9);
      expect(c.verdict).toBe(hand[p.mpn].verdict);
      const entry = m.diode.find((e) => e.partId === p.partId)!;
      expect(entry, p.mpn).toBeDefined();
      expect(p.verdict).toBe(entry.verdict);
      expect(p.checks.map((x) => x.verdict)).toEqual(
        entry.checks.map((x) => (x.ok ? 'pass' : x.severity === 'margin' ? 'marginal' : 'fail')),
      );
    }
  });
});

describe('bad input', () => {
  const issuePaths = (body: { issues: { path: string }[] }) => body.issues.map((i) => i.path);

  it.each([
    ['ids=1', 'role'],
    ['role=motor&ids=1', 'role'],
    ['role=switch', 'ids'],
    ['role=switch&ids=', 'ids'],
    ['role=switch&ids=1,2,3,4,5', 'ids'],
    ['role=switch&ids=abc', 'ids.0'],
    ['role=switch&ids=0', 'ids.0'],
    ['role=switch&ids=1&includePending=maybe', 'includePending'],
  ])('%s → 400 naming %s', async (query, field) => {
    const res = await compare(query);
    expect(res.status, res.text).toBe(400);
    expect(issuePaths(res.body)).toContain(field);
    expect(res.body.error).toEqual(expect.any(String));
  });

  it('a diode asked for the switch line → 400 naming ids', async () => {
    const res = await compare(`role=switch&ids=${ids.get('ORS20-60-MA')}`);
    expect(res.status).toBe(400);
    expect(issuePaths(res.body)).toEqual(['ids']);
    expect(res.body.issues[0].message).toMatch(/is a diode, not a mosfet/);
  });

  it('an unknown part or design → 404', async () => {
    expect((await compare('role=switch&ids=999999')).status).toBe(404);
    const res = await api()
      .get(`/api/designs/999999/compare?role=switch&ids=${ids.get('CWN60L04-S3')}`)
      .set('Cookie', designer);
    expect(res.status).toBe(404);
  });

  it('a part pending review: a librarian compares it, a buyer gets 404 (not theirs, not approved)', async () => {
    // MQN30T08-S3 is seeded pending review (db/seeds/data/mosfets.ts).
    const pending = ids.get('MQN30T08-S3')!;
    const owner = await knex('parts').where({ id: pending }).first('created_by', 'review_status');
    expect(owner.review_status).toBe('pending');
    const asLibrarian = await compare(`role=switch&ids=${pending}`, librarian);
    expect(asLibrarian.status, asLibrarian.text).toBe(200);
    expect(asLibrarian.body.parts[0].outsideRanking).toMatch(/pending review/i);
    expect((await compare(`role=switch&ids=${pending}`, buyer)).status).toBe(404);
  });
});

describe('near misses of a parametric search with nothing found', () => {
  it('Schottky diodes with VRRM ≥ 150 V: none; the closest is the highest-rated approved Schottky', async () => {
    // From the seed data file: the approved Schottky parts' VRRM values; none reaches 150 V.
    const schottky = demoDiodes.filter((d) => d.params.kind === 'schottky' && d.reviewStatus === 'approved');
    const best = Math.max(...schottky.map((d) => d.params.vrrmV));
    expect(best).toBeLessThan(150);
    const res = await api().get('/api/parts?category=diode&kind=schottky&vrrmMinV=150').set('Cookie', designer);
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(0);
    const near = res.body.nearMisses as { mpn: string; misses: string[] }[];
    expect(near.length).toBeGreaterThan(0);
    expect(near[0].misses).toEqual([`VRRM ${best} V, needs ≥ 150 V`]);
    // The other filters still hold: every near miss is a Schottky.
    for (const m of near) expect(schottky.map((d) => d.mpn)).toContain(m.mpn);
  });

  it('a search that finds parts carries no hint', async () => {
    const res = await api().get('/api/parts?category=diode&vrrmMinV=20').set('Cookie', designer);
    expect(res.body.total).toBeGreaterThan(0);
    expect(res.body.nearMisses).toBeUndefined();
  });
});

describe('near misses of a workspace list with nothing passing', () => {
  it('the AG-3 at 150 °C ambient: no diode passes; the hint lists the closest by relative miss (recomputed here)', async () => {
    // 150 °C ambient leaves no junction headroom under the demo parts' Tj max (150–175 °C) less the 25 K margin.
    const hot = { ...input, ambientMaxC: 150, ambientMinC: Math.min(input.ambientMinC, 150) };
    const res = await api().post(`/api/designs/${designId}/match`).set('Cookie', designer).send({ input: hot, limit: 500 });
    expect(res.status, res.text).toBe(200);
    const page = res.body as DesignMatchPage;
    const list = page.diode;
    expect(page.lists.diode.counts.pass).toBe(0);
    expect(list.length).toBeGreaterThan(0);
    // Second method: the rule written out here — marginal first, then the largest |value − limit| / |limit|
    // among the checks that do not hold (Infinity without numbers), then fewer misses, then part number.
    const worst = (e: (typeof list)[number]) =>
      e.checks
        .filter((c) => (e.verdict === 'fail' ? !c.ok && c.severity !== 'margin' : !c.ok))
        .reduce((m, c) => Math.max(m, c.value != null && c.limit ? Math.abs(c.value - c.limit) / Math.abs(c.limit) : Infinity), 0);
    const misses = (e: (typeof list)[number]) =>
      e.checks.filter((c) => (e.verdict === 'fail' ? !c.ok && c.severity !== 'margin' : !c.ok)).length;
    const expected = [...list]
      .sort(
        (a, b) =>
          (a.verdict === 'marginal' ? 0 : 1) - (b.verdict === 'marginal' ? 0 : 1) ||
          worst(a) - worst(b) ||
          misses(a) - misses(b) ||
          a.mpn.localeCompare(b.mpn),
      )
      .slice(0, 3)
      .map((e) => e.mpn);
    expect(page.lists.diode.nearMisses.map((m) => m.mpn)).toEqual(expected);
    for (const m of page.lists.diode.nearMisses) expect(m.misses.every((x) => /needs [≤≥]|: /.test(x.text))).toBe(true);
  });
});
