/**
 * The design report PDF: it parses, every page carries the header, it names the design, its revision,
 * the chosen parts and the cautions, and the curves are vector paths (no images).
 * Catalogue: the invented demo parts in db/seeds/data, given ids here. Set REPORT_PDF_OUT=/tmp/report.pdf
 * to keep the bench-fan report for a look.
 */
import { writeFileSync } from 'node:fs';
import { PDFDocument, PDFName, PDFRawStream, PDFStream } from 'pdf-lib';
import { getDocument, OPS } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { describe, expect, it } from 'vitest';
import { demoDiodes, demoDrivers, demoMosfets, demoMotors } from '../../db/seeds/data/index.ts';
import { buildBom } from '../../src/lib/bom.ts';
import { matchDesign, suggestSelections } from '../../src/lib/design-match.ts';
import type { DesignInput } from '../../src/lib/domain/design.ts';
import type { Part, PartOf } from '../../src/lib/domain/parts.ts';
import { CAUTIONS } from '../../src/lib/safety-notes.ts';
import { buildDesignReportPdf, type DesignReportData } from '../../src/server/reports/design-report.ts';
import { faceHasChars, loadSourceSans, measureText, textRuns } from '../../src/server/reports/fonts.ts';
import { DEFERRAL_LINE } from '../../src/server/reports/report-closing.ts';

let nextId = 1;
const withIds = <P extends Omit<Part, 'id' | 'version'>>(parts: P[]): (P & { id: number; version: number })[] =>
  parts.map((p) => ({ ...p, id: nextId++, version: 1 }));
const motors = withIds(demoMotors) as PartOf<'motor'>[];
const mosfets = withIds(demoMosfets) as PartOf<'mosfet'>[];
const drivers = withIds(demoDrivers) as PartOf<'driver'>[];
const diodes = withIds(demoDiodes) as PartOf<'diode'>[];
const partsById = new Map<number, Part>([...motors, ...mosfets, ...drivers, ...diodes].map((p) => [p.id as number, p]));
const motorByMpn = (mpn: string): PartOf<'motor'> => motors.find((m) => m.mpn === mpn) as PartOf<'motor'>;

const noSelections: DesignInput['selections'] = {
  switch: { chosenPartId: null, alternatePartIds: [] },
  driver: { chosenPartId: null, alternatePartIds: [] },
  diode: { chosenPartId: null, alternatePartIds: [] },
};

/** Invented bench fan: 12 V adapter, switched on/off from a 3.3 V controller pin that floats at reset. */
const fanMotor = motorByMpn('HVM-390F-120A');
const benchFan: DesignInput = {
  name: 'Fume bench fan, 12 V',
  motor: { source: 'catalogue', partId: fanMotor.id as number },
  supply: {
    minV: 11.4,
    nomV: 12,
    maxV: 12.6,
    preset: 'bench-12v',
    internalResistanceOhm: 0,
    continuousCurrentA: null,
    currentLimitA: null,
  },
  wiringResistanceOhm: 0.05,
  shuntResistanceOhm: 0,
  logic: {
    railV: 3.3,
    highV: 2.9,
    lowV: 0.4,
    pinSourceCurrentA: 0.008,
    pinSinkCurrentA: 0.008,
    resetPull: 'none',
    resetPullOhms: 40_000,
    resetPullTolerance: 0.3,
    sharedSupply: null,
  },
  drive: { mode: 'onoff' },
  ambientMinC: 0,
  ambientMaxC: 40,
  load: { kind: 'speed', speedRpm: 15_000 },
  margins: { voltageDerating: 0.8, thermalMarginC: 25 },
  driverSupplyV: null,
  boardQuantity: 25,
  stallProtection: { kind: 'none' },
  resetStartIntent: null,
  selections: noSelections,
};

/** Invented battery dosing pump: 2S Li-ion, PWM from 1.8 V logic (needs a gate driver), motor entered by hand. */
const pumpParams = motorByMpn('HVM-370P-072A').params;
const batteryPump: DesignInput = {
  name: 'Portable sampler pump (PWM)',
  motor: { source: 'manual', label: 'Gear-pump motor, 7.2 V (entered by hand)', params: pumpParams },
  supply: { minV: 6, nomV: 7.4, maxV: 8.4, preset: '2s-liion', internalResistanceOhm: 0, continuousCurrentA: null, currentLimitA: null },
  wiringResistanceOhm: 0.08,
  shuntResistanceOhm: 0.05,
  logic: {
    railV: 1.8,
    highV: 1.35,
    lowV: 0.45,
    pinSourceCurrentA: 0.004,
    pinSinkCurrentA: 0.004,
    resetPull: 'down',
    resetPullOhms: 40_000,
    resetPullTolerance: 0.3,
    sharedSupply: null,
  },
  drive: { mode: 'pwm', frequencyHz: 20_000, dutyMin: 0.3, dutyMax: 0.9 },
  ambientMinC: -10,
  ambientMaxC: 45,
  load: { kind: 'torque', torqueNm: 0.008 },
  margins: { voltageDerating: 0.8, thermalMarginC: 25 },
  driverSupplyV: null,
  boardQuantity: 100,
  stallProtection: { kind: 'none' },
  resetStartIntent: null,
  selections: noSelections,
};

function reportData(base: DesignInput, choose = true): DesignReportData {
  const motorPart = base.motor.source === 'catalogue' ? (partsById.get(base.motor.partId) as PartOf<'motor'>) : null;
  const label = base.motor.source === 'catalogue' ? (motorPart as PartOf<'motor'>).mpn : base.motor.label;
  const params = motorPart ? motorPart.params : (base.motor as { params: PartOf<'motor'>['params'] }).params;
  const catalogue = { mosfets, drivers, diodes, excluded: { switch: 0, driver: 0, diode: 0 } };
  const first = matchDesign(base, label, params, catalogue);
  const input = { ...base, selections: choose ? suggestSelections(first) : noSelections };
  // Re-matched with the picks, as the service does: the switch is then judged at the chosen driver.
  const match = matchDesign(input, label, params, catalogue);
  const motor = motorPart ? { manufacturer: motorPart.manufacturer, mpn: motorPart.mpn, description: motorPart.description } : null;
  const bom = buildBom({ input, motor, partsById, pull: match.powerOn?.recommendedPull ?? null });
  const design = {
    id: 7,
    name: base.name,
    revision: 1,
    ownerName: 'Dana Example',
    status: 'draft' as const,
    generatedAt: new Date('2026-03-02T09:30:00Z'),
  };
  return { design, input, match, bom, partsById };
}

interface PageText {
  text: string;
  constructPathOps: number;
  imageOps: number;
}

const IMAGE_OPS = new Set<number>([
  OPS.paintImageXObject,
  OPS.paintInlineImageXObject,
  OPS.paintImageMaskXObject,
  OPS.paintImageXObjectRepeat,
]);

/** Text (items joined by spaces, whitespace collapsed) and drawing-operator counts per page, via pdfjs-dist. */
async function readPages(bytes: Uint8Array): Promise<PageText[]> {
  const doc = await getDocument({ data: bytes.slice(), isEvalSupported: false, verbosity: 0 }).promise;
  const pages: PageText[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const page = await doc.getPage(i);
    const content = await page.getTextContent();
    const text = content.items
      .map((item) => ('str' in item ? item.str : ''))
      .join(' ')
      .replace(/\s+/g, ' ');
    const ops = await page.getOperatorList();
    pages.push({
      text,
      constructPathOps: ops.fnArray.filter((fn) => fn === OPS.constructPath).length,
      imageOps: ops.fnArray.filter((fn) => IMAGE_OPS.has(fn)).length,
    });
  }
  await doc.destroy();
  return pages;
}

const mpnOf = (id: number | null): string => (id == null ? '(none)' : (partsById.get(id)?.mpn ?? '(missing)'));

describe.each([
  // Both drivers run from the motor supply (driverSupplyV null), so the lowest driver supply is the supply minimum
  // entered above: 11.4 V for the fan (no switch holds a jam on the 2.9 V pin drive), 6 V for the pump.
  {
    title: 'bench fan, on/off, 3.3 V logic',
    design: benchFan,
    out: process.env.REPORT_PDF_OUT,
    judged: ['lowest driver supply of 11.4 V (the chosen driver)'],
  },
  {
    title: 'battery pump, PWM, 1.8 V logic with a driver',
    design: batteryPump,
    out: process.env.REPORT_PDF_OUT?.replace(/\.pdf$/, '-pump.pdf'),
    judged: ['lowest driver supply of 6 V (the chosen driver)', 'Drivers are ranked for the chosen switch'],
  },
])('design report: $title', ({ design, out, judged }) => {
  const data = reportData(design);
  let bytes: Uint8Array;
  let pages: PageText[];
  const allText = (): string => pages.map((p) => p.text).join(' ');

  it('builds a PDF that pdf-lib loads, with several pages and our metadata', async () => {
    bytes = await buildDesignReportPdf(data);
    if (out) writeFileSync(out, bytes);
    const doc = await PDFDocument.load(bytes, { updateMetadata: false });
    expect(doc.getPageCount()).toBeGreaterThan(1);
    expect(doc.getProducer()).toBe('Stallpoint');
    expect(doc.getTitle()).toContain(design.name);
    expect(doc.getCreationDate()?.toISOString()).toBe('2026-03-02T09:30:00.000Z');
    const [width, height] = [doc.getPage(0).getWidth(), doc.getPage(0).getHeight()];
    expect([Math.round(width), Math.round(height)]).toEqual([595, 842]); // A4 portrait in points (ISO 216)
    pages = await readPages(bytes);
    expect(pages.length).toBe(doc.getPageCount());
  });

  it('prints the header on every page: product, design name, revision, date, page x of y', () => {
    pages.forEach((p, i) => {
      expect(p.text).toContain('Stallpoint design report');
      expect(p.text).toContain(design.name);
      expect(p.text).toContain('Rev 1');
      expect(p.text).toContain('2026-03-02');
      expect(p.text).toContain(`Page ${i + 1} of ${pages.length}`);
    });
  });

  it('names the chosen switch and diode (and driver when one is needed)', () => {
    const sel = data.input.selections;
    expect(sel.switch.chosenPartId).not.toBeNull();
    expect(sel.diode.chosenPartId).not.toBeNull();
    expect(allText()).toContain(mpnOf(sel.switch.chosenPartId));
    expect(allText()).toContain(mpnOf(sel.diode.chosenPartId));
    if (data.match.driverNeeded) expect(allText()).toContain(mpnOf(sel.driver.chosenPartId));
    else expect(allText()).toContain('Direct drive from the logic pin');
  });

  it('says at what drive the switch is judged, which driver it is paired with, and the stall protection', () => {
    for (const j of judged) expect(allText()).toContain(j);
    const sel = data.input.selections;
    if (data.match.driverNeeded) {
      expect(allText()).toContain(`Switches are judged at driver ${mpnOf(sel.driver.chosenPartId)}:`);
      expect(allText()).toContain(`Drivers are ranked for the chosen switch ${mpnOf(sel.switch.chosenPartId)}`);
    }
    expect(allText()).toContain('Jammed shaft judged with stall protection none');
  });

  it('prints every caution title from safety-notes and the closing deferral line', () => {
    for (const c of CAUTIONS) expect(allText()).toContain(c.title);
    expect(allText()).toContain(DEFERRAL_LINE.replace(/\s+/g, ' '));
  });

  it('draws the curves as vector paths, with no images anywhere', async () => {
    const chartPage = pages.find((p) => p.text.includes('Speed (rpm) against torque'));
    expect(chartPage).toBeDefined();
    expect(chartPage?.constructPathOps).toBeGreaterThan(30); // 4 curves, grid, axes, markers
    expect(pages.every((p) => p.imageOps === 0)).toBe(true);
    const doc = await PDFDocument.load(bytes);
    const images = doc.context
      .enumerateIndirectObjects()
      .filter(
        ([, obj]) =>
          (obj instanceof PDFRawStream || obj instanceof PDFStream) && obj.dict.get(PDFName.of('Subtype')) === PDFName.of('Image'),
      );
    expect(images).toHaveLength(0);
  });

  it('renders Greek and degree signs from the embedded font and verdicts as words', () => {
    expect(allText()).toMatch(/Ω/);
    expect(allText().replace(/ /g, '')).toContain('RθJA'); // drawn in runs: Latin R, Greek θ, Latin JA
    expect(allText()).toContain('°C');
    expect(allText()).toMatch(/PASS|✓ pass/);
  });
});

describe('design report with a recorded reset-start intent', () => {
  it("prints the motor state at reset and the designer's reason", async () => {
    const reason = 'The fan purges the hood at power-up before the controller boots.';
    const bytes = await buildDesignReportPdf(reportData({ ...benchFan, resetStartIntent: { reason } }));
    const text = (await readPages(bytes)).map((p) => p.text).join(' ');
    expect(text).toContain('Motor at reset as built');
    expect(text).toContain(reason);
  });
});

describe('design report without chosen parts, on the standard fallback font', () => {
  it('says plainly that no part was chosen and still builds', async () => {
    const bytes = await buildDesignReportPdf(reportData(benchFan, false), { standardFonts: true });
    const text = (await readPages(bytes)).map((p) => p.text).join(' ');
    expect(text).toContain('No switch has been chosen for this design.');
    expect(text).toContain('No freewheel diode has been chosen for this design.');
    expect(text).toContain('Ohm'); // Ω spelled out: Helvetica (WinAnsi) has no Greek
  });
});

describe('shared font loader', () => {
  it('has Ω and θ in Source Sans 3 but spells out characters a face lacks instead of throwing', async () => {
    const pdf = await PDFDocument.create();
    const fonts = await loadSourceSans(pdf);
    expect(faceHasChars(fonts.regular, 'Ωθµ±°–·')).toBe(true);
    expect(faceHasChars(fonts.regular, '≤')).toBe(false); // not in the shipped Latin or Greek subsets
    expect(
      textRuns(fonts.regular, 'I ≤ 2 A')
        .map((r) => r.text)
        .join(''),
    ).toBe('I <= 2 A');
    expect(measureText(fonts.bold, 'RθJA 250 K/W', 9)).toBeGreaterThan(0);
  });
});

describe('a report of a design that is not ready says so (issue 14 item 9)', () => {
  const failing = [
    { path: 'selections.switch.chosenPartId', message: 'QX11 fails stall-thermal' },
    { path: 'selections.diode.alternatePartIds.1', message: 'DX32 is pending review — not approved' },
  ];
  const withStatus = (status: 'draft' | 'ready', issues: typeof failing): DesignReportData => {
    const data = reportData(benchFan);
    return { ...data, design: { ...data.design, status }, readiness: { issues, acceptedResetStart: null } };
  };

  it('a draft with failing picks: "Draft — not verified" on every page and each failing pick named by its line', async () => {
    const pages = await readPages(await buildDesignReportPdf(withStatus('draft', failing)));
    for (const p of pages) expect(p.text).toContain('Draft — not verified');
    const first = pages[0].text;
    expect(first).toContain(
      'Draft — not verified. 2 checks fail at the current catalogue: not for buying or building until each is resolved.',
    );
    expect(first).toContain('Low-side switch: QX11 fails stall-thermal');
    expect(first).toContain('Freewheel diode, alternate 2: DX32 is pending review — not approved');
  });

  it('a draft whose picks all hold still says it is not verified (never marked ready)', async () => {
    const pages = await readPages(await buildDesignReportPdf(withStatus('draft', [])));
    expect(pages[0].text).toContain('Draft — not verified. Every pick holds at the current catalogue, but the designer has not marked');
    expect(pages[0].text).not.toContain('Failing picks');
  });

  it('a design marked ready that holds carries no draft mark', async () => {
    const pages = await readPages(await buildDesignReportPdf(withStatus('ready', [])));
    expect(pages.map((p) => p.text).join(' ')).not.toContain('not verified');
  });

  it('a design marked ready that no longer holds is a draft again in its outputs', async () => {
    const pages = await readPages(await buildDesignReportPdf(withStatus('ready', failing.slice(0, 1))));
    expect(pages[0].text).toContain('Draft — not verified. 1 check fails at the current catalogue');
  });
});
