/**
 * Motor curves drawn as vector paths: speed and current against torque at the minimum and maximum
 * supply, with the operating point and stall marked. Axis ticks come from src/lib/chart.ts, as on the page.
 */
import type { Color } from 'pdf-lib';
import { linearScale, niceTicks, tickLabel, type Scale } from '../../lib/chart.ts';
import type { MotorView } from '../../lib/design-match.ts';
import { fixed, torqueFromNm } from '../../lib/units.ts';
import { COPPER, HAIRLINE, INK, MUTED, type ReportLayout } from './report-layout.ts';
import { sig } from './report-format.ts';

interface Point {
  x: number;
  y: number;
}

interface Series {
  points: Point[];
  color: Color;
  dash: number[];
}

interface ChartSpec {
  title: string;
  xTitle: string;
  series: Series[];
  operating: Point[];
  stall: Point[];
}

interface Box {
  x: number;
  top: number;
  width: number;
  height: number;
}

const CHART_HEIGHT_PT = 168;
const LEGEND_HEIGHT_PT = 18;
const DASHED = [4, 2.5];

function svgPolyline(points: Point[], sx: Scale, sy: Scale): string {
  // drawSvgPath flips the y axis about its origin; drawing at origin (0, 0) makes SVG y = −PDF y.
  return points.map((p, i) => `${i === 0 ? 'M' : 'L'} ${fixed(sx(p.x), 2)} ${fixed(-sy(p.y), 2)}`).join(' ');
}

function drawAxes(layout: ReportLayout, sx: Scale, sy: Scale, ticks: { x: number[]; y: number[] }): void {
  const page = layout.page;
  const [x0, x1] = sx.range;
  const [y0, y1] = sy.range;
  for (const t of ticks.y) {
    page.drawLine({ start: { x: x0, y: sy(t) }, end: { x: x1, y: sy(t) }, thickness: 0.4, color: HAIRLINE });
    const label = tickLabel(t);
    layout.textAt(label, x0 - 4 - layout.measure(label, { sizePt: 7 }), sy(t) - 2.4, { sizePt: 7, color: MUTED });
  }
  for (const t of ticks.x) {
    page.drawLine({ start: { x: sx(t), y: y0 }, end: { x: sx(t), y: y1 }, thickness: 0.4, color: HAIRLINE });
    const label = tickLabel(t);
    layout.textAt(label, sx(t) - layout.measure(label, { sizePt: 7 }) / 2, y0 - 10, { sizePt: 7, color: MUTED });
  }
  page.drawLine({ start: { x: x0, y: y0 }, end: { x: x1, y: y0 }, thickness: 0.8, color: INK });
  page.drawLine({ start: { x: x0, y: y0 }, end: { x: x0, y: y1 }, thickness: 0.8, color: INK });
}

function drawOperatingMark(layout: ReportLayout, at: Point): void {
  layout.page.drawCircle({ x: at.x, y: at.y, size: 2.6, color: INK });
}

function drawStallMark(layout: ReportLayout, at: Point): void {
  const d = 3;
  layout.page.drawLine({ start: { x: at.x - d, y: at.y - d }, end: { x: at.x + d, y: at.y + d }, thickness: 1, color: INK });
  layout.page.drawLine({ start: { x: at.x - d, y: at.y + d }, end: { x: at.x + d, y: at.y - d }, thickness: 1, color: INK });
}

function drawChart(layout: ReportLayout, spec: ChartSpec, box: Box): void {
  const all = spec.series.flatMap((s) => s.points).concat(spec.operating, spec.stall);
  const xt = niceTicks(0, Math.max(...all.map((p) => p.x)), 5);
  const yt = niceTicks(0, Math.max(...all.map((p) => p.y)), 5);
  const sx = linearScale(xt.domain, [box.x + 34, box.x + box.width - 6]);
  const sy = linearScale(yt.domain, [box.top - box.height + 26, box.top - 16]);
  layout.textAt(spec.title, box.x, box.top - 9, { sizePt: 8.5, bold: true });
  drawAxes(layout, sx, sy, { x: xt.ticks, y: yt.ticks });
  for (const s of spec.series) {
    layout.page.drawSvgPath(svgPolyline(s.points, sx, sy), { x: 0, y: 0, borderColor: s.color, borderWidth: 1.3, borderDashArray: s.dash });
  }
  spec.operating.forEach((p) => drawOperatingMark(layout, { x: sx(p.x), y: sy(p.y) }));
  spec.stall.forEach((p) => drawStallMark(layout, { x: sx(p.x), y: sy(p.y) }));
  const xTitleWidth = layout.measure(spec.xTitle, { sizePt: 7.5 });
  layout.textAt(spec.xTitle, (sx.range[0] + sx.range[1] - xTitleWidth) / 2, box.top - box.height + 3, { sizePt: 7.5, color: MUTED });
}

const mNm = (torqueNm: number): number => torqueFromNm(torqueNm, 'mN·m');

function specsOf(motor: MotorView): [ChartSpec, ChartSpec] {
  const ends = [
    { at: motor.atMin, op: motor.operatingMin, color: INK, dash: [] as number[] },
    { at: motor.atMax, op: motor.operatingMax, color: COPPER, dash: DASHED },
  ];
  const ops = ends.flatMap((e) => (e.op ? [e.op] : []));
  const speed: ChartSpec = {
    title: 'Speed (rpm) against torque',
    xTitle: 'Torque (mN·m)',
    series: ends.map((e) => ({ points: e.at.curve.map((p) => ({ x: mNm(p.torqueNm), y: p.speedRpm })), color: e.color, dash: e.dash })),
    operating: ops.map((o) => ({ x: mNm(o.torqueNm), y: o.speedRpm })),
    stall: ends.map((e) => ({ x: mNm(e.at.atSupply.stallTorqueNm), y: 0 })),
  };
  const current: ChartSpec = {
    title: 'Current (A) against torque',
    xTitle: 'Torque (mN·m)',
    series: ends.map((e) => ({ points: e.at.curve.map((p) => ({ x: mNm(p.torqueNm), y: p.currentA })), color: e.color, dash: e.dash })),
    operating: ops.map((o) => ({ x: mNm(o.torqueNm), y: o.currentA })),
    stall: ends.map((e) => ({ x: mNm(e.at.atSupply.stallTorqueNm), y: e.at.atSupply.stallCurrentA })),
  };
  return [speed, current];
}

function drawLegend(layout: ReportLayout, motor: MotorView): void {
  const y = layout.y - 9;
  let x = layout.left;
  const item = (draw: (x: number) => void, words: string, widthPt: number): void => {
    draw(x);
    layout.textAt(words, x + widthPt + 4, y - 2.6, { sizePt: 8 });
    x += widthPt + 4 + layout.measure(words, { sizePt: 8 }) + 16;
  };
  const sample = (color: Color, dash: number[]) => (x0: number) =>
    layout.page.drawLine({ start: { x: x0, y }, end: { x: x0 + 22, y }, thickness: 1.3, color, dashArray: dash });
  item(sample(INK, []), `solid: minimum supply ${sig(motor.atMin.atSupply.supplyV)} V`, 22);
  item(sample(COPPER, DASHED), `dashed: maximum supply ${sig(motor.atMax.atSupply.supplyV)} V`, 22);
  item((x0) => drawOperatingMark(layout, { x: x0 + 3, y }), 'operating point', 6);
  item((x0) => drawStallMark(layout, { x: x0 + 3, y }), 'stall', 6);
  layout.y -= LEGEND_HEIGHT_PT;
}

/** Two charts side by side plus a legend in words; moves the cursor below them. */
export function drawMotorCurves(layout: ReportLayout, motor: MotorView): void {
  layout.ensureSpace(CHART_HEIGHT_PT + LEGEND_HEIGHT_PT + 8);
  const width = (layout.widthPt - 24) / 2;
  const [speed, current] = specsOf(motor);
  drawChart(layout, speed, { x: layout.left, top: layout.y, width, height: CHART_HEIGHT_PT });
  drawChart(layout, current, { x: layout.left + width + 24, top: layout.y, width, height: CHART_HEIGHT_PT });
  layout.y -= CHART_HEIGHT_PT + 6;
  drawLegend(layout, motor);
}
