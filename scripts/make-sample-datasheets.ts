/**
 * Generates example datasheet PDFs for a few invented parts of the Kestrel Fluidics demo catalogue.
 *
 *   npx tsx scripts/make-sample-datasheets.ts
 *
 * Output: data-samples/datasheets/<MPN>.pdf (one MOSFET, one diode, one gate driver). Every page carries a
 * banner saying the part is invented, and the part number and kind of part ("N-channel MOSFET", "Schottky
 * barrier rectifier", "gate driver"), which the check on attach looks for (src/lib/datasheet-text.ts;
 * tests/api/datasheets.test.ts attaches each sample to its part without a question). The generator is exported so tests can build a PDF in memory:
 *
 *   import { makeDatasheetPdf } from './make-sample-datasheets';
 *   const bytes = await makeDatasheetPdf(part);
 *
 * Text uses Source Sans 3 through the shared loader in src/server/reports/fonts.ts (Latin plus Greek subsets
 * for Ω and θ). If those files cannot be found it falls back to the standard Helvetica font and spells
 * Greek letters out.
 */
import { PDFDocument, type PDFPage, rgb } from 'pdf-lib';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

import type { DiodeParams, DriverParams, MosfetParams, MotorParams, Part, PartSource } from '../src/lib/domain/parts';
import { demoDiodes, demoDrivers, demoMosfets } from '../db/seeds/data/index';
import type { AnyDemoPart } from '../db/seeds/data/types';
import { drawTextRuns, type FontPair, loadSourceSans, measureText } from '../src/server/reports/fonts';
import { openInputOutput } from '../src/lib/driver-input';

/** A part as stored (with id/version) or as seeded (without). */
export type DatasheetPart = AnyDemoPart | Part;

export const DEMO_BANNER = 'EXAMPLE DATASHEET — invented part for the Stallpoint demo';

/** Parts for which the CLI writes sample PDFs. */
export const SAMPLE_DATASHEET_MPNS = ['MQN20T06-S3', 'ORS20-40-MA', 'PLR1NL20-S6'] as const;

// ---------------------------------------------------------------------------------------------
// Fonts and text
// ---------------------------------------------------------------------------------------------

interface TextOpts {
  size?: number;
  bold?: boolean;
  color?: ReturnType<typeof rgb>;
  align?: 'left' | 'right' | 'center';
}

class Writer {
  constructor(
    readonly page: PDFPage,
    readonly fonts: FontPair,
  ) {}

  text(text: string, x: number, y: number, opts: TextOpts = {}): void {
    const size = opts.size ?? 9;
    const face = opts.bold ? this.fonts.bold : this.fonts.regular;
    const width = measureText(face, text, size);
    const cx = opts.align === 'right' ? x - width : opts.align === 'center' ? x - width / 2 : x;
    drawTextRuns(this.page, face, text, { x: cx, y, sizePt: size, color: opts.color ?? INK });
  }

  width(text: string, size = 9, bold = false): number {
    return measureText(bold ? this.fonts.bold : this.fonts.regular, text, size);
  }

  /** Wraps text into lines no wider than maxWidth; returns the y below the last line. */
  paragraph(text: string, x: number, y: number, maxWidth: number, opts: TextOpts = {}): number {
    const size = opts.size ?? 9;
    const lineHeight = size * 1.35;
    let line = '';
    for (const word of text.split(/\s+/)) {
      const candidate = line ? `${line} ${word}` : word;
      if (line && this.width(candidate, size, opts.bold) > maxWidth) {
        this.text(line, x, y, opts);
        y -= lineHeight;
        line = word;
      } else line = candidate;
    }
    if (line) {
      this.text(line, x, y, opts);
      y -= lineHeight;
    }
    return y;
  }
}

// ---------------------------------------------------------------------------------------------
// Layout helpers
// ---------------------------------------------------------------------------------------------

const PAGE_W = 595.28; // A4 portrait, points
const PAGE_H = 841.89;
const MARGIN = 48;
const CONTENT_W = PAGE_W - 2 * MARGIN;
const INK = rgb(0.1, 0.12, 0.16);
const MUTED = rgb(0.38, 0.42, 0.48);
const RULE = rgb(0.78, 0.8, 0.84);
const ACCENT = rgb(0.09, 0.33, 0.52);
const BANNER_BG = rgb(1, 0.93, 0.8);
const BANNER_INK = rgb(0.62, 0.24, 0.0);
const HEAD_BG = rgb(0.91, 0.94, 0.97);

interface Column {
  title: string;
  width: number; // fraction of the table width
  align?: 'left' | 'right' | 'center';
}

/** Draws a simple ruled table; returns the y below it. */
function table(w: Writer, x: number, y: number, tableWidth: number, columns: Column[], rows: string[][]): number {
  const rowH = 15;
  const size = 8.5;
  const xs: number[] = [];
  let acc = x;
  for (const c of columns) {
    xs.push(acc);
    acc += c.width * tableWidth;
  }
  const cellX = (i: number) => {
    const c = columns[i];
    const cw = c.width * tableWidth;
    return c.align === 'right' ? xs[i] + cw - 4 : c.align === 'center' ? xs[i] + cw / 2 : xs[i] + 4;
  };
  w.page.drawRectangle({ x, y: y - rowH, width: tableWidth, height: rowH, color: HEAD_BG });
  columns.forEach((c, i) => w.text(c.title, cellX(i), y - rowH + 4.5, { size, bold: true, align: c.align }));
  y -= rowH;
  w.page.drawLine({ start: { x, y }, end: { x: x + tableWidth, y }, thickness: 0.8, color: ACCENT });
  for (const row of rows) {
    row.forEach((cell, i) => w.text(cell, cellX(i), y - rowH + 4.5, { size, align: columns[i].align }));
    y -= rowH;
    w.page.drawLine({ start: { x, y }, end: { x: x + tableWidth, y }, thickness: 0.4, color: RULE });
  }
  return y;
}

function sectionTitle(w: Writer, title: string, y: number): number {
  w.text(title, MARGIN, y, { size: 11.5, bold: true, color: ACCENT });
  w.page.drawLine({ start: { x: MARGIN, y: y - 4 }, end: { x: PAGE_W - MARGIN, y: y - 4 }, thickness: 0.6, color: ACCENT });
  return y - 20;
}

function banner(w: Writer, y: number): number {
  const h = 24;
  w.page.drawRectangle({
    x: MARGIN,
    y: y - h,
    width: CONTENT_W,
    height: h,
    color: BANNER_BG,
    borderColor: BANNER_INK,
    borderWidth: 1,
  });
  w.text(DEMO_BANNER, PAGE_W / 2, y - h + 8, { size: 11, bold: true, color: BANNER_INK, align: 'center' });
  return y - h - 14;
}

function footer(w: Writer, part: DatasheetPart, pageNo: number, pages: number): void {
  const y = 28;
  w.page.drawLine({ start: { x: MARGIN, y: y + 12 }, end: { x: PAGE_W - MARGIN, y: y + 12 }, thickness: 0.4, color: RULE });
  w.text(`${part.manufacturer} · ${part.mpn} · invented part, Kestrel Fluidics demo catalogue (kestrel-fluidics.example)`, MARGIN, y, {
    size: 7.5,
    color: MUTED,
  });
  w.text(`Page ${pageNo} of ${pages}`, PAGE_W - MARGIN, y, { size: 7.5, color: MUTED, align: 'right' });
}

function header(w: Writer, part: DatasheetPart, subtitle: string): number {
  let y = PAGE_H - MARGIN;
  w.text(part.manufacturer.toUpperCase(), MARGIN, y, { size: 9, bold: true, color: MUTED });
  w.text(`Package: ${part.package}`, PAGE_W - MARGIN, y, { size: 9, color: MUTED, align: 'right' });
  y -= 28;
  w.text(part.mpn, MARGIN, y, { size: 24, bold: true, color: INK });
  y -= 18;
  w.text(subtitle, MARGIN, y, { size: 12, color: ACCENT });
  return y - 14;
}

// ---------------------------------------------------------------------------------------------
// Number formatting
// ---------------------------------------------------------------------------------------------

function fmt(x: number, digits = 3): string {
  if (x === 0) return '0';
  const abs = Math.abs(x);
  const s = abs >= 100 ? x.toFixed(0) : Number(x.toPrecision(digits)).toString();
  return s.replace('-', '−');
}

function ohms(x: number): { value: string; unit: string } {
  return x < 1 ? { value: fmt(x * 1000), unit: 'mΩ' } : { value: fmt(x), unit: 'Ω' };
}

function signed(v: number, p: boolean): string {
  return p ? `−${fmt(v)}` : fmt(v);
}

function amps(a: number): string {
  return a < 1 ? `${fmt(a * 1000)} mA` : `${fmt(a)} A`;
}

function lifecycleLine(part: DatasheetPart): string {
  const lc: Record<DatasheetPart['lifecycle'], string> = {
    active: 'Active',
    nrnd: 'Not recommended for new designs',
    'last-buy': 'Last-time buy',
    obsolete: 'Obsolete',
  };
  return `Lifecycle: ${lc[part.lifecycle]}${part.lifecycleEffectiveDate ? ` (from ${part.lifecycleEffectiveDate})` : ''}`;
}

// ---------------------------------------------------------------------------------------------
// Category content
// ---------------------------------------------------------------------------------------------

interface Sheet {
  subtitle: string;
  features: string[];
  absMax: string[][]; // symbol, parameter, value, unit
  electrical: string[][]; // symbol, parameter, conditions, min, typ, max, unit
  /** Optional drawing on page 2, given the top y; returns the y below it. */
  drawing?: (w: Writer, y: number) => number;
  notes: string[];
}

const ABS_COLUMNS: Column[] = [
  { title: 'Symbol', width: 0.14 },
  { title: 'Parameter', width: 0.56 },
  { title: 'Value', width: 0.18, align: 'right' },
  { title: 'Unit', width: 0.12, align: 'center' },
];

const ELEC_COLUMNS: Column[] = [
  { title: 'Symbol', width: 0.12 },
  { title: 'Parameter', width: 0.25 },
  { title: 'Test conditions', width: 0.33 },
  { title: 'Min', width: 0.07, align: 'right' },
  { title: 'Typ', width: 0.07, align: 'right' },
  { title: 'Max', width: 0.07, align: 'right' },
  { title: 'Unit', width: 0.09, align: 'center' },
];

function mosfetSheet(p: MosfetParams): Sheet {
  const isP = p.channel === 'p';
  const ch = isP ? 'P-channel' : 'N-channel';
  const lowest = Math.min(...p.rdsOn.map((r) => r.vgsV));
  const best = p.rdsOn.reduce((a, b) => (b.maxOhm < a.maxOhm ? b : a));
  const bestR = ohms(best.maxOhm);
  const electrical: string[][] = [
    ['V(BR)DSS', 'Drain-source breakdown', `VGS = 0 V, ID = ${signed(250, isP)} µA`, signed(p.vdsMaxV, isP), '', '', 'V'],
    [
      'VGS(th)',
      'Gate threshold voltage',
      `VDS = VGS, ID = ${signed(p.vgsThTestCurrentA * 1e6, isP)} µA`,
      signed(p.vgsThMinV, isP),
      '',
      signed(p.vgsThMaxV, isP),
      'V',
    ],
  ];
  for (const r of [...p.rdsOn].sort((a, b) => b.vgsV - a.vgsV)) {
    const max = ohms(r.maxOhm);
    const typ = r.typOhm === null ? '' : r.maxOhm < 1 ? fmt(r.typOhm * 1000) : fmt(r.typOhm);
    const idPart = r.idA === null ? '' : `, ID = ${signed(r.idA, isP)} A`;
    electrical.push([
      'RDS(on)',
      'Drain-source on-resistance',
      `VGS = ${signed(r.vgsV, isP)} V${idPart}, Tj = ${r.tjC} °C`,
      '',
      typ,
      max.value,
      max.unit,
    ]);
  }
  electrical.push([
    'Qg',
    'Total gate charge',
    `VGS = ${signed(p.qgTestVgsV, isP)} V, VDS = ${signed(p.vdsMaxV / 2, isP)} V`,
    '',
    fmt(p.qgTotalNc),
    '',
    'nC',
  ]);
  if (p.qgsNc !== null) electrical.push(['Qgs', 'Gate-source charge', 'as for Qg', '', fmt(p.qgsNc), '', 'nC']);
  if (p.qgdNc !== null) electrical.push(['Qgd', 'Gate-drain (Miller) charge', 'as for Qg', '', fmt(p.qgdNc), '', 'nC']);
  if (p.vPlateauV !== null) electrical.push(['Vplateau', 'Gate plateau voltage', 'as for Qg', '', signed(p.vPlateauV, isP), '', 'V']);
  if (p.bodyDiodeVfV !== null)
    electrical.push([
      'VSD',
      'Body-diode forward voltage',
      `IS = ${signed(Math.min(1, p.idContinuousA / 2), isP)} A, VGS = 0 V`,
      '',
      signed(p.bodyDiodeVfV, isP),
      '',
      'V',
    ]);

  return {
    subtitle: `${ch} enhancement MOSFET, ${p.vdsMaxV} V, ${bestR.value} ${bestR.unit} max at VGS = ${best.vgsV} V`,
    features: [
      `Drain-source rating ${signed(p.vdsMaxV, isP)} V; gate-source rating ±${fmt(p.vgsMaxV)} V`,
      `On-resistance characterised from ${fmt(lowest)} V gate drive (${p.rdsOn.map((r) => `${fmt(r.vgsV)} V`).join(', ')})`,
      `Gate threshold ${fmt(p.vgsThMinV)} V to ${fmt(p.vgsThMaxV)} V at ${fmt(p.vgsThTestCurrentA * 1e6)} µA`,
      `Total gate charge ${fmt(p.qgTotalNc)} nC at ${fmt(p.qgTestVgsV)} V`,
      `Junction-to-ambient ${fmt(p.rthJaCPerW)} K/W on the standard test board; Tj up to ${p.tjMaxC} °C`,
    ],
    absMax: [
      ['VDS', 'Drain-source voltage', signed(p.vdsMaxV, isP), 'V'],
      ['VGS', 'Gate-source voltage', `±${fmt(p.vgsMaxV)}`, 'V'],
      ['ID', 'Continuous drain current, TA = 25 °C (test board)', signed(p.idContinuousA, isP), 'A'],
      ['IDM', 'Pulsed drain current (pulse width limited by Tj,max)', signed(p.idPulsedA, isP), 'A'],
      ['RθJA', 'Thermal resistance, junction to ambient (test board)', fmt(p.rthJaCPerW), 'K/W'],
      ['Tj', 'Operating junction temperature', `−55 to ${p.tjMaxC}`, '°C'],
    ],
    electrical,
    drawing: (w, y) => rdsOnChart(w, p, y),
    notes: [
      'RDS(on) is guaranteed only at the gate voltages listed. Between two listed points the curve is drawn by interpolation in log space; below the lowest point the part is not characterised.',
      'The continuous current assumes the junction-to-ambient resistance of the test board and RDS(on) at the maximum junction temperature. Real boards differ.',
    ],
  };
}

function diodeSheet(p: DiodeParams): Sheet {
  const kindName: Record<DiodeParams['kind'], string> = {
    schottky: 'Schottky barrier rectifier',
    ultrafast: 'Ultrafast recovery rectifier',
    fast: 'Fast recovery rectifier',
    general: 'General-purpose rectifier',
  };
  const trrRow =
    p.trrNs === null
      ? ['trr', 'Reverse recovery time', 'majority-carrier device', '', '—', '', 'ns']
      : ['trr', 'Reverse recovery time', 'IF = 0.5 A, IR = 1 A, to 0.25 A', '', '', fmt(p.trrNs), 'ns'];
  return {
    subtitle: `${kindName[p.kind]}, ${p.vrrmV} V, ${fmt(p.ifAvA)} A`,
    features: [
      `Repetitive peak reverse voltage ${p.vrrmV} V`,
      `Average forward current ${fmt(p.ifAvA)} A; surge ${fmt(p.ifsmA)} A`,
      `Forward voltage ${fmt(p.vfV)} V max at ${fmt(p.vfAtIfA)} A`,
      p.trrNs === null
        ? 'No stored charge: suited to PWM freewheeling at any practical frequency'
        : `Reverse recovery ${fmt(p.trrNs)} ns max`,
    ],
    absMax: [
      ['VRRM', 'Repetitive peak reverse voltage', fmt(p.vrrmV), 'V'],
      ['IF(AV)', 'Average forward current', fmt(p.ifAvA), 'A'],
      ['IFSM', 'Non-repetitive surge current, single 10 ms half sine', fmt(p.ifsmA), 'A'],
      ...(p.ifrmA !== null ? [['IFRM', 'Repetitive peak forward current', fmt(p.ifrmA), 'A']] : []),
      ['Tj', 'Operating junction temperature', `−55 to ${fmt(p.tjMaxC ?? (p.kind === 'schottky' ? 125 : 150))}`, '°C'],
    ],
    electrical: [
      ['VF', 'Forward voltage', `IF = ${fmt(p.vfAtIfA)} A, Tj = 25 °C`, '', '', fmt(p.vfV), 'V'],
      trrRow,
      ...(p.rthJaCPerW !== null
        ? [['RθJA', 'Thermal resistance, junction to ambient', 'minimal-pad test board', '', fmt(p.rthJaCPerW), '', 'K/W']]
        : []),
    ],
    notes: [
      'As a motor freewheel diode: cathode to the positive supply, anode to the switched motor terminal.',
      p.trrNs === null
        ? 'Schottky parts leak more reverse current when hot; check the reverse voltage margin at the highest supply.'
        : 'Keep the reverse recovery time well below one per cent of the PWM period.',
    ],
  };
}

function driverSheet(p: DriverParams): Sheet {
  const inputs =
    p.inputLogic === 'fixed'
      ? { vih: fmt(p.inputHighMin), vil: fmt(p.inputLowMax), cond: 'any supply in range', unit: 'V' }
      : p.inputLogic === 'ratio'
        ? { vih: `${fmt(p.inputHighMin)} × VDD`, vil: `${fmt(p.inputLowMax)} × VDD`, cond: 'referred to the driver supply VDD', unit: '' }
        : { vih: `${fmt(p.inputHighMin)} × VL`, vil: `${fmt(p.inputLowMax)} × VL`, cond: 'referred to the logic-side rail VL', unit: '' };
  const outOpen = { undefined: 'undefined (no input pull)', high: 'HIGH', low: 'LOW' }[openInputOutput(p.inputPull, p.inverting)];
  const pullName = p.inputPull === 'up' ? 'pull-up to the input supply' : 'pull-down to GND';
  const pullText =
    p.inputPull === 'none'
      ? 'none (the input floats when open)'
      : `internal ${pullName}${p.inputPullOhms !== null ? `, ${fmt(p.inputPullOhms / 1000)} kΩ typ.` : ''}`;
  const kind = p.kind === 'gate-driver' ? 'low-side gate driver' : 'level shifter';
  return {
    subtitle:
      `${p.channels === 1 ? 'Single' : p.channels === 2 ? 'Dual' : `${p.channels}-channel`} ` +
      `${p.inverting ? 'inverting' : 'non-inverting'} ${kind}, ${fmt(p.supplyMinV)} V to ${fmt(p.supplyMaxV)} V`,
    features: [
      `Supply ${fmt(p.supplyMinV)} V to ${fmt(p.supplyMaxV)} V`,
      `Peak output current ${amps(p.sourceCurrentA)} source, ${amps(p.sinkCurrentA)} sink`,
      `Input threshold: high from ${inputs.vih}${inputs.unit ? ' V' : ''}, low up to ${inputs.vil}${inputs.unit ? ' V' : ''} (${inputs.cond})`,
      `Propagation delay ${fmt(p.propagationDelayNs)} ns`,
      `Input pull: ${pullText}`,
      `Output with input open: ${outOpen}`,
    ],
    absMax: [
      ['VDD', 'Supply voltage (recommended range)', `${fmt(p.supplyMinV)} to ${fmt(p.supplyMaxV)}`, 'V'],
      ['IOH', 'Peak source current', fmt(p.sourceCurrentA), 'A'],
      ['IOL', 'Peak sink current', fmt(p.sinkCurrentA), 'A'],
      ['N', 'Channels', String(p.channels), ''],
    ],
    electrical: [
      ['VIH', 'Input high threshold', inputs.cond, inputs.vih, '', '', inputs.unit],
      ['VIL', 'Input low threshold', inputs.cond, '', '', inputs.vil, inputs.unit],
      ['VOH', 'Output high voltage', `IO = ${amps(p.sourceCurrentA)} source`, `VDD − ${fmt(p.outputHighDropV)}`, '', '', 'V'],
      ['VOL', 'Output low voltage', `IO = ${amps(p.sinkCurrentA)} sink`, '', '', fmt(p.outputLowMaxV), 'V'],
      ['tpd', 'Propagation delay', 'CL = 1 nF, 50 % to 50 %', '', fmt(p.propagationDelayNs), '', 'ns'],
      ...(p.inputPull !== 'none' && p.inputPullOhms !== null
        ? [
            [
              p.inputPull === 'up' ? 'RPU' : 'RPD',
              `Input ${pullName.replace(' to the input supply', '').replace(' to GND', '')} resistance`,
              p.inputPull === 'up' ? 'input to its supply' : 'input to GND',
              '',
              fmt(p.inputPullOhms / 1000),
              '',
              'kΩ',
            ],
          ]
        : []),
    ],
    drawing: (w, y) => {
      y = sectionTitle(w, 'Logic table', y);
      const on = p.inverting ? 'LOW' : 'HIGH';
      const off = p.inverting ? 'HIGH' : 'LOW';
      return table(
        w,
        MARGIN,
        y,
        CONTENT_W * 0.6,
        [
          { title: 'Input', width: 0.45 },
          { title: 'Output', width: 0.55 },
        ],
        [
          ['High', on],
          ['Low', off],
          ['Open', outOpen],
        ],
      );
    },
    notes: [
      p.inverting
        ? 'Inverting part: when the controller pin is low or left open with a pull-down, the output is high and a low-side switch conducts.'
        : 'Non-inverting part: the output follows the input.',
      p.inputLogic === 'ratio'
        ? 'Input thresholds scale with the driver supply, so logic from a lower rail may not reach the high threshold.'
        : 'Decouple the supply pin close to the part; the peak currents flow only during gate transitions.',
    ],
  };
}

function motorSheet(p: MotorParams): Sheet {
  const range = p.voltageMinV !== null && p.voltageMaxV !== null ? `${fmt(p.voltageMinV)} to ${fmt(p.voltageMaxV)}` : '—';
  const electrical: string[][] = [
    ['n0', 'No-load speed', `V = ${fmt(p.ratedVoltageV)} V`, '', fmt(p.noLoadSpeedRpm), '', 'rpm'],
    ['I0', 'No-load current', `V = ${fmt(p.ratedVoltageV)} V`, '', fmt(p.noLoadCurrentA), '', 'A'],
    ['IS', 'Stall current', `V = ${fmt(p.ratedVoltageV)} V`, '', fmt(p.stallCurrentA), '', 'A'],
    ['TS', 'Stall torque', `V = ${fmt(p.ratedVoltageV)} V`, '', fmt(p.stallTorqueNm * 1000), '', 'mN·m'],
  ];
  if (p.terminalResistanceOhm !== null) electrical.push(['R', 'Terminal resistance', '20 °C', '', fmt(p.terminalResistanceOhm), '', 'Ω']);
  if (p.inductanceH !== null) electrical.push(['L', 'Terminal inductance', '1 kHz', '', fmt(p.inductanceH * 1000), '', 'mH']);
  if (p.rotorInertiaKgM2 !== null) electrical.push(['J', 'Rotor inertia', '', '', fmt(p.rotorInertiaKgM2 * 1e7), '', 'g·cm²']);
  return {
    subtitle: `Brushed DC motor, ${fmt(p.ratedVoltageV)} V, ${fmt(p.noLoadSpeedRpm)} rpm no-load`,
    features: [`Rated ${fmt(p.ratedVoltageV)} V, operating range ${range} V`, `Stall current ${fmt(p.stallCurrentA)} A at rated voltage`],
    absMax: [
      ['V', 'Rated voltage', fmt(p.ratedVoltageV), 'V'],
      ['Vrange', 'Operating voltage range', range, 'V'],
    ],
    electrical,
    notes: ['Figures at 20 °C ambient. A cold winding draws more current at stall.'],
  };
}

function sheetFor(part: DatasheetPart): Sheet {
  switch (part.category) {
    case 'mosfet':
      return mosfetSheet(part.params);
    case 'diode':
      return diodeSheet(part.params);
    case 'driver':
      return driverSheet(part.params);
    case 'motor':
      return motorSheet(part.params);
  }
}

// ---------------------------------------------------------------------------------------------
// RDS(on) versus VGS drawing
// ---------------------------------------------------------------------------------------------

function niceStep(span: number, ticks: number): number {
  const raw = span / ticks;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const n = raw / mag;
  return (n <= 1 ? 1 : n <= 2 ? 2 : n <= 2.5 ? 2.5 : n <= 5 ? 5 : 10) * mag;
}

/** Log-space interpolation between neighbouring spec points (the same rule the checks use). */
function interpolateLog(points: { v: number; r: number }[], v: number): number {
  for (let i = 1; i < points.length; i++) {
    const a = points[i - 1];
    const b = points[i];
    if (v >= a.v && v <= b.v) {
      const t = (v - a.v) / (b.v - a.v);
      return Math.exp(Math.log(a.r) + t * (Math.log(b.r) - Math.log(a.r)));
    }
  }
  return points[points.length - 1].r;
}

function rdsOnChart(w: Writer, p: MosfetParams, top: number): number {
  let y = sectionTitle(w, 'On-resistance versus gate-source voltage (Tj = 25 °C)', top);
  const spec = [...p.rdsOn].filter((r) => r.tjC === 25).sort((a, b) => a.vgsV - b.vgsV);
  if (spec.length === 0) return y;
  const milli = spec[0].maxOhm < 1;
  const scale = milli ? 1000 : 1;
  const unit = milli ? 'mΩ' : 'Ω';
  const maxPts = spec.map((r) => ({ v: r.vgsV, r: r.maxOhm * scale }));
  const typPts = spec.filter((r) => r.typOhm !== null).map((r) => ({ v: r.vgsV, r: (r.typOhm ?? 0) * scale }));

  const plotX = MARGIN + 46;
  const plotW = CONTENT_W - 70;
  const plotH = 190;
  const plotY = y - plotH - 6; // bottom edge
  const xMax = Math.max(...spec.map((r) => r.vgsV)) <= 5 ? 5 : 10;
  const yTop = Math.max(...maxPts.map((q) => q.r)) * 1.25;
  const yStep = niceStep(yTop, 5);
  const yMax = Math.ceil(yTop / yStep) * yStep;
  const px = (v: number) => plotX + (v / xMax) * plotW;
  const py = (r: number) => plotY + (r / yMax) * plotH;

  // Threshold band: below VGS(th) max the part may conduct only partly.
  w.page.drawRectangle({
    x: px(p.vgsThMinV),
    y: plotY,
    width: px(p.vgsThMaxV) - px(p.vgsThMinV),
    height: plotH,
    color: rgb(0.99, 0.9, 0.86),
  });
  w.text('VGS(th) range', (px(p.vgsThMinV) + px(p.vgsThMaxV)) / 2, plotY + plotH - 12, { size: 7, color: BANNER_INK, align: 'center' });

  // Grid and ticks.
  const xStep = xMax <= 5 ? 0.5 : 1;
  for (let v = 0; v <= xMax + 1e-9; v += xStep) {
    w.page.drawLine({ start: { x: px(v), y: plotY }, end: { x: px(v), y: plotY + plotH }, thickness: 0.3, color: RULE });
    w.text(fmt(v), px(v), plotY - 11, { size: 7.5, align: 'center', color: MUTED });
  }
  for (let r = 0; r <= yMax + 1e-9; r += yStep) {
    w.page.drawLine({ start: { x: plotX, y: py(r) }, end: { x: plotX + plotW, y: py(r) }, thickness: 0.3, color: RULE });
    w.text(fmt(r), plotX - 4, py(r) - 2.5, { size: 7.5, align: 'right', color: MUTED });
  }
  w.page.drawRectangle({ x: plotX, y: plotY, width: plotW, height: plotH, borderColor: INK, borderWidth: 0.8 });
  w.text(`|VGS| (V)`, plotX + plotW / 2, plotY - 24, { size: 8.5, align: 'center' });
  w.text(`RDS(on) (${unit})`, MARGIN - 2, plotY + plotH + 8, { size: 8.5 });

  const curve = (pts: { v: number; r: number }[], color: ReturnType<typeof rgb>, dashed: boolean) => {
    if (pts.length === 0) return;
    const steps = 40;
    const lo = pts[0].v;
    const hi = pts[pts.length - 1].v;
    let prev = { x: px(lo), y: py(pts[0].r) };
    for (let i = 1; i <= steps && hi > lo; i++) {
      const v = lo + ((hi - lo) * i) / steps;
      const next = { x: px(v), y: py(interpolateLog(pts, v)) };
      w.page.drawLine({ start: prev, end: next, thickness: 1.4, color, dashArray: dashed ? [3, 2] : undefined });
      prev = next;
    }
    for (const q of pts) w.page.drawCircle({ x: px(q.v), y: py(q.r), size: 2.6, color });
  };
  curve(typPts, rgb(0.45, 0.6, 0.75), true);
  curve(maxPts, ACCENT, false);
  for (const q of maxPts) w.text(`${fmt(q.r)} ${unit}`, px(q.v) + 5, py(q.r) + 4, { size: 7.5, color: ACCENT });

  // Legend.
  const lx = plotX + plotW - 130;
  const ly = plotY + plotH - 16;
  w.page.drawLine({ start: { x: lx, y: ly + 3 }, end: { x: lx + 18, y: ly + 3 }, thickness: 1.4, color: ACCENT });
  w.text('maximum (guaranteed)', lx + 22, ly, { size: 7.5 });
  w.page.drawLine({
    start: { x: lx, y: ly - 9 },
    end: { x: lx + 18, y: ly - 9 },
    thickness: 1.4,
    color: rgb(0.45, 0.6, 0.75),
    dashArray: [3, 2],
  });
  w.text('typical', lx + 22, ly - 12, { size: 7.5 });

  y = plotY - 36;
  y = w.paragraph(
    `Not characterised below ${fmt(spec[0].vgsV)} V: a gate drive between VGS(th) max (${fmt(p.vgsThMaxV)} V) and that point may leave the channel only partly on.`,
    MARGIN,
    y,
    CONTENT_W,
    { size: 8, color: MUTED },
  );
  return y - 6;
}

// ---------------------------------------------------------------------------------------------
// Document
// ---------------------------------------------------------------------------------------------

function orderingRows(sources: PartSource[]): string[][] {
  return sources.map((s) => {
    const first = s.priceBreaks[0];
    const last = s.priceBreaks[s.priceBreaks.length - 1];
    const money = (x: number) => `${s.currency} ${x < 1 ? x.toFixed(4) : x.toFixed(2)}`;
    return [
      s.distributor,
      s.sku,
      String(s.moq),
      first ? `${money(first.unitPrice)} @ ${first.qty}` : '—',
      last ? `${money(last.unitPrice)} @ ${last.qty}` : '—',
    ];
  });
}

export interface DatasheetOptions {
  /** Use the built-in Helvetica instead of Source Sans 3 (as when the font files are missing). */
  standardFonts?: boolean;
}

/** Builds a two-page example datasheet for one invented catalogue part. */
export async function makeDatasheetPdf(part: DatasheetPart, options: DatasheetOptions = {}): Promise<Uint8Array> {
  const pdf = await PDFDocument.create();
  const fonts = await loadSourceSans(pdf, { boldWeight: 700, standard: options.standardFonts ?? false });
  const sheet = sheetFor(part);
  const fixedDate = new Date('2025-01-01T00:00:00Z');
  pdf.setTitle(`${part.mpn} example datasheet (invented part)`);
  pdf.setAuthor('Stallpoint demo catalogue');
  pdf.setSubject(DEMO_BANNER);
  pdf.setKeywords(['Stallpoint', 'demo', 'invented part', part.category, part.mpn]);
  pdf.setCreator('scripts/make-sample-datasheets.ts');
  pdf.setProducer('pdf-lib');
  pdf.setCreationDate(fixedDate);
  pdf.setModificationDate(fixedDate);

  // Page 1: identity, features, ratings.
  const w1 = new Writer(pdf.addPage([PAGE_W, PAGE_H]), fonts);
  let y = header(w1, part, sheet.subtitle);
  y = banner(w1, y);
  y = w1.paragraph(part.description, MARGIN, y, CONTENT_W, { size: 10 });
  y -= 4;
  w1.text(lifecycleLine(part), MARGIN, y, { size: 8.5, color: MUTED });
  y -= 24;
  y = sectionTitle(w1, 'Features', y);
  for (const f of sheet.features) {
    w1.text('•', MARGIN + 4, y, { size: 9.5, color: ACCENT });
    y = w1.paragraph(f, MARGIN + 16, y, CONTENT_W - 16, { size: 9.5 });
    y -= 2;
  }
  y -= 12;
  y = sectionTitle(w1, 'Absolute maximum ratings (TA = 25 °C unless stated)', y);
  y = table(w1, MARGIN, y, CONTENT_W, ABS_COLUMNS, sheet.absMax);
  y -= 12;
  y = w1.paragraph(
    'Stresses beyond these ratings may damage the part. They are not operating conditions; design with margin.',
    MARGIN,
    y,
    CONTENT_W,
    { size: 8, color: MUTED },
  );
  y -= 16;
  y = sectionTitle(w1, 'Ordering information (demo distributors)', y);
  table(
    w1,
    MARGIN,
    y,
    CONTENT_W,
    [
      { title: 'Distributor', width: 0.28 },
      { title: 'SKU', width: 0.24 },
      { title: 'MOQ', width: 0.08, align: 'right' },
      { title: 'First break', width: 0.2, align: 'right' },
      { title: 'Best break', width: 0.2, align: 'right' },
    ],
    orderingRows(part.sources),
  );

  // Page 2: electrical characteristics, drawing, notes.
  const w2 = new Writer(pdf.addPage([PAGE_W, PAGE_H]), fonts);
  y = PAGE_H - MARGIN;
  w2.text(`${part.mpn} — ${sheet.subtitle}`, MARGIN, y, { size: 10, bold: true, color: MUTED });
  y -= 12;
  y = banner(w2, y);
  y = sectionTitle(w2, 'Electrical characteristics (Tj = 25 °C unless stated)', y);
  y = table(w2, MARGIN, y, CONTENT_W, ELEC_COLUMNS, sheet.electrical);
  y -= 22;
  if (sheet.drawing) y = sheet.drawing(w2, y) - 28;
  y = sectionTitle(w2, 'Notes', y);
  sheet.notes.forEach((n, i) => {
    w2.text(`${i + 1}.`, MARGIN, y, { size: 8.5 });
    y = w2.paragraph(n, MARGIN + 14, y, CONTENT_W - 14, { size: 8.5 }) - 3;
  });
  y -= 8;
  w2.paragraph(
    `This document describes an invented part from the Stallpoint demo catalogue. The maker, part number, distributors and figures are fictional and must not be used to design real hardware.`,
    MARGIN,
    y,
    CONTENT_W,
    { size: 8.5, bold: true, color: BANNER_INK },
  );

  [w1, w2].forEach((w, i) => footer(w, part, i + 1, 2));
  return pdf.save({ useObjectStreams: false });
}

// ---------------------------------------------------------------------------------------------
// CLI
// ---------------------------------------------------------------------------------------------

export function sampleDatasheetParts(): DatasheetPart[] {
  const all: DatasheetPart[] = [...demoMosfets, ...demoDiodes, ...demoDrivers];
  return SAMPLE_DATASHEET_MPNS.map((mpn) => {
    const found = all.find((p) => p.mpn === mpn);
    if (!found) throw new Error(`Sample part ${mpn} is missing from the demo catalogue`);
    return found;
  });
}

async function main(): Promise<void> {
  const outDir = fileURLToPath(new URL('../data-samples/datasheets/', import.meta.url));
  mkdirSync(outDir, { recursive: true });
  for (const part of sampleDatasheetParts()) {
    const bytes = await makeDatasheetPdf(part);
    const file = join(outDir, `${part.mpn}.pdf`);
    writeFileSync(file, bytes);
    console.log(`wrote ${file} (${bytes.length} bytes)`);
  }
}

const invokedDirectly = process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href;
if (invokedDirectly) {
  main().catch((err: unknown) => {
    console.error(err);
    process.exitCode = 1;
  });
}
