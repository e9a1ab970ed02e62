// A small inline SVG line chart of values over dates (lessons of a pilot, flights of an aircraft). No script.
import { escapeHtml } from '../report/escapeHtml.js';

export interface TrendPoint {
  /** When [UTC s]. */
  tUtc: number;
  /** Value in the chart's unit; a non-finite value is left out. */
  value: number;
  /** Tooltip text (escaped). */
  label: string;
}

export interface TrendSeries {
  name: string;
  /** CSS colour of the line and markers (from a fixed palette; never from the input). */
  colour: string;
  points: TrendPoint[];
}

/** Plot frame in SVG user units: width, height and the margins round the plotting area. */
export const TREND_FRAME = { width: 560, height: 170, left: 46, right: 12, top: 12, bottom: 30 } as const;

/** Where a point lands: x linear in time over [t0, t1] (middle when t0 = t1), y linear in value over [0, yMax]. */
export function trendXY(tUtc: number, value: number, t0: number, t1: number, yMax: number): { x: number; y: number } {
  const f = TREND_FRAME;
  const w = f.width - f.left - f.right;
  const h = f.height - f.top - f.bottom;
  const x = t1 > t0 ? f.left + ((tUtc - t0) / (t1 - t0)) * w : f.left + w / 2;
  const y = f.top + h - (yMax > 0 ? value / yMax : 0) * h;
  return { x, y };
}

/** The smallest of 1, 2, 2.5, 5 × 10^k that is ≥ x (a round top for the y axis); 1 for x ≤ 0. */
export function niceCeiling(x: number): number {
  if (!(x > 0)) return 1;
  const p = 10 ** Math.floor(Math.log10(x));
  for (const m of [1, 2, 2.5, 5, 10]) if (m * p >= x * (1 - 1e-12)) return m * p;
  return 10 * p;
}

function r1(x: number): string {
  return x.toFixed(1);
}

/**
 * An SVG line chart (role img, labelled by `title`): each series a polyline with a marker and a tooltip
 * per point, y axis from 0 to a round ceiling of the largest value with three labelled ticks in `unit`,
 * x axis labelled with the first and last date (UTC). Points sorted by time. All text escaped.
 * @returns '' when no series has a finite point
 */
export function trendChartSvg(title: string, unit: string, series: TrendSeries[]): string {
  const pts = series.map((s) => s.points.filter((p) => Number.isFinite(p.value) && Number.isFinite(p.tUtc)).sort((a, b) => a.tUtc - b.tUtc));
  const all = pts.flat();
  if (all.length === 0) return '';
  const t0 = Math.min(...all.map((p) => p.tUtc));
  const t1 = Math.max(...all.map((p) => p.tUtc));
  const yMax = niceCeiling(Math.max(...all.map((p) => p.value)));
  const f = TREND_FRAME;
  const out: string[] = [];
  out.push(`<svg class="trend" viewBox="0 0 ${f.width} ${f.height}" width="${f.width}" height="${f.height}" role="img" aria-label="${escapeHtml(title)}" xmlns="http://www.w3.org/2000/svg">`);
  out.push(`<title>${escapeHtml(title)}</title>`);
  for (const k of [0, 0.5, 1]) {
    const { y } = trendXY(t0, yMax * k, t0, t1, yMax);
    out.push(`<line x1="${f.left}" x2="${f.width - f.right}" y1="${r1(y)}" y2="${r1(y)}" stroke="#d9d6cc" stroke-width="1"/>`);
    out.push(`<text x="${f.left - 6}" y="${r1(y + 4)}" text-anchor="end" font-size="11" fill="#4a505a">${escapeHtml(`${+(yMax * k).toFixed(2)}${unit}`)}</text>`);
  }
  const day = (t: number) => new Date(Math.round(t) * 1000).toISOString().slice(0, 10);
  const yAxis = f.height - f.bottom;
  out.push(`<text x="${f.left}" y="${yAxis + 18}" font-size="11" fill="#4a505a">${escapeHtml(day(t0))}</text>`);
  if (t1 > t0) out.push(`<text x="${f.width - f.right}" y="${yAxis + 18}" text-anchor="end" font-size="11" fill="#4a505a">${escapeHtml(day(t1))}</text>`);
  series.forEach((s, i) => {
    const xy = pts[i].map((p) => ({ p, ...trendXY(p.tUtc, p.value, t0, t1, yMax) }));
    if (xy.length === 0) return;
    const colour = escapeHtml(s.colour);
    if (xy.length > 1) out.push(`<polyline fill="none" stroke="${colour}" stroke-width="2" points="${xy.map((q) => `${r1(q.x)},${r1(q.y)}`).join(' ')}"/>`);
    for (const q of xy) {
      out.push(`<circle cx="${r1(q.x)}" cy="${r1(q.y)}" r="3.5" fill="${colour}"><title>${escapeHtml(`${s.name}: ${q.p.label}`)}</title></circle>`);
    }
  });
  out.push('</svg>');
  const legend = series
    .filter((_s, i) => pts[i].length > 0)
    .map((s) => `<span class="key"><span class="swatch" style="background:${escapeHtml(s.colour)}"></span>${escapeHtml(s.name)}</span>`)
    .join(' ');
  return `<figure class="trend-figure">${out.join('')}<figcaption>${legend}</figcaption></figure>`;
}
