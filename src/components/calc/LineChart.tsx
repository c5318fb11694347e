import { fixed } from '../../lib/units.ts';
import { linearScale, niceTicks, tickLabel } from '../../lib/chart.ts';

export interface ChartSeries {
  label: string;
  points: { x: number; y: number }[];
  dashed?: boolean;
  tone: 'copper' | 'graphite';
}

export interface ChartMarker {
  x: number;
  y: number;
  shape: 'circle' | 'diamond' | 'square';
  label: string;
  tone: 'copper' | 'graphite';
}

interface Props {
  title: string;
  xLabel: string;
  yLabel: string;
  series: ChartSeries[];
  markers?: ChartMarker[];
  testId?: string;
}

const W = 340;
const H = 210;
const M = { left: 48, right: 12, top: 12, bottom: 36 };
const STROKE = { copper: '#a85a2a', graphite: '#2a2c2e' } as const;

function markerPath(shape: ChartMarker['shape'], x: number, y: number): string {
  const r = 4.5;
  if (shape === 'diamond') return `M${x} ${y - r - 1}L${x + r + 1} ${y}L${x} ${y + r + 1}L${x - r - 1} ${y}Z`;
  if (shape === 'square') return `M${x - r} ${y - r}h${2 * r}v${2 * r}h${-2 * r}Z`;
  return `M${x - r} ${y}a${r} ${r} 0 1 0 ${2 * r} 0a${r} ${r} 0 1 0 ${-2 * r} 0`;
}

/** A small SVG line chart; series differ by dash pattern and legend text as well as colour. */
export default function LineChart({ title, xLabel, yLabel, series, markers = [], testId }: Props) {
  const xs = series.flatMap((s) => s.points.map((p) => p.x));
  const ys = series.flatMap((s) => s.points.map((p) => p.y));
  if (xs.length === 0) return null;
  const xt = niceTicks(0, Math.max(...xs), 4);
  const yt = niceTicks(Math.min(0, ...ys), Math.max(...ys), 4);
  const x = linearScale(xt.domain, [M.left, W - M.right]);
  const y = linearScale(yt.domain, [H - M.bottom, M.top]);
  return (
    <figure className="card p-2 m-0" data-testid={testId}>
      <figcaption className="text-sm font-semibold px-1">{title}</figcaption>
      <svg viewBox={`0 0 ${W} ${H}`} className="w-full h-auto" role="img" aria-label={`${title}: ${yLabel} against ${xLabel}`}>
        {yt.ticks.map((t) => (
          <g key={`y${t}`}>
            <line x1={M.left} x2={W - M.right} y1={y(t)} y2={y(t)} stroke="#e6dccb" strokeWidth="1" />
            <text x={M.left - 5} y={y(t) + 3.5} textAnchor="end" fontSize="10" fill="#55595e">
              {tickLabel(t)}
            </text>
          </g>
        ))}
        {xt.ticks.map((t) => (
          <g key={`x${t}`}>
            <line x1={x(t)} x2={x(t)} y1={H - M.bottom} y2={H - M.bottom + 4} stroke="#7b7f84" />
            <text x={x(t)} y={H - M.bottom + 15} textAnchor="middle" fontSize="10" fill="#55595e">
              {tickLabel(t)}
            </text>
          </g>
        ))}
        <line x1={M.left} x2={W - M.right} y1={H - M.bottom} y2={H - M.bottom} stroke="#7b7f84" />
        <line x1={M.left} x2={M.left} y1={M.top} y2={H - M.bottom} stroke="#7b7f84" />
        <text x={(M.left + W - M.right) / 2} y={H - 4} textAnchor="middle" fontSize="10.5" fill="#2a2c2e">
          {xLabel}
        </text>
        <text
          x={11}
          y={(M.top + H - M.bottom) / 2}
          textAnchor="middle"
          fontSize="10.5"
          fill="#2a2c2e"
          transform={`rotate(-90 11 ${(M.top + H - M.bottom) / 2})`}
        >
          {yLabel}
        </text>
        {series.map((s) => (
          <polyline
            key={s.label}
            fill="none"
            stroke={STROKE[s.tone]}
            strokeWidth="1.8"
            strokeDasharray={s.dashed ? '5 4' : undefined}
            points={s.points.map((p) => `${fixed(x(p.x), 1)},${fixed(y(p.y), 1)}`).join(' ')}
          />
        ))}
        {markers.map((m) => (
          <g key={`${m.label}${m.x}`}>
            <path d={markerPath(m.shape, x(m.x), y(m.y))} fill="#fffcf6" stroke={STROKE[m.tone]} strokeWidth="1.6">
              <title>{m.label}</title>
            </path>
          </g>
        ))}
      </svg>
      <ul className="flex flex-wrap gap-x-3 text-xs text-ink-soft px-1">
        {series.map((s) => (
          <li key={s.label} className="flex items-center gap-1">
            <svg width="22" height="6" aria-hidden="true">
              <line x1="0" x2="22" y1="3" y2="3" stroke={STROKE[s.tone]} strokeWidth="2" strokeDasharray={s.dashed ? '5 4' : undefined} />
            </svg>
            {s.label}
          </li>
        ))}
        {markers.map((m) => (
          <li key={`l${m.label}${m.x}`} className="flex items-center gap-1">
            <svg width="12" height="12" viewBox="0 0 12 12" aria-hidden="true">
              <path d={markerPath(m.shape, 6, 6)} fill="#fffcf6" stroke={STROKE[m.tone]} strokeWidth="1.4" />
            </svg>
            {m.label}
          </li>
        ))}
      </ul>
    </figure>
  );
}
