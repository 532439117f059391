/**
 * Small SVG chart builders for the HTML report: pure string builders, no dependencies, no
 * scripts. Every builder takes values that were already computed and only maps them to pixels:
 *   linear axis  px = p₀ + (v − lo)/(hi − lo) · (p₁ − p₀),
 *   log axis     px = p₀ + (log₁₀ v − log₁₀ lo)/(log₁₀ hi − log₁₀ lo) · (p₁ − p₀).
 * Ticks: a log axis gets whole decades 10^k (every second or third decade when there are many);
 * a linear axis gets steps of 1, 2 or 5 × 10^k, about five of them, with the range widened to
 * whole steps. The mode axis is a band axis: mode i sits in the middle of the i-th band.
 * Output is well-formed XML (one <svg> element per chart, text escaped) so it embeds in HTML.
 */
import { xmlSafe } from './xml-text.js';

export interface Scale {
  kind: 'linear' | 'log';
  lo: number;
  hi: number;
  ticks: number[];
}

/** Decades a log axis spans before the report switches to it (our choice: two decades, ×100). */
const LOG_WHEN_DECADES = 2;

const INK = '#222';
const GRID = '#d8d8d8';
const BAR = '#2f5d8c';
const FLAG = '#b3261e';
const MUTED = '#8a8a8a';
const FONT = 'font-family="sans-serif" font-size="11"';
/** A white outline behind text drawn over lines. */
const HALO = ' stroke="#fff" stroke-width="3" paint-order="stroke"';

/** Text safe inside XML/HTML: characters XML 1.0 forbids removed (./xml-text.ts), &, <, >, quotes escaped. */
export function escapeText(text: string): string {
  return xmlSafe(text, Infinity).replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

/** 10^k exactly as the decimal literal `1ek` reads (Math.pow can be one ulp off). */
function decade(k: number): number {
  return Number(`1e${k}`);
}

/**
 * Log axis from the decade at or below lo to the decade at or above hi (at least one decade
 * wide), ticked at every decade, or every step-th so that at most ten ticks remain.
 */
export function logScale(lo: number, hi: number): Scale {
  const k0 = Math.floor(Math.log10(lo) + 1e-9);
  let k1 = Math.max(k0 + 1, Math.ceil(Math.log10(hi) - 1e-9));
  const step = Math.max(1, Math.ceil((k1 - k0 + 1) / 10));
  k1 = k0 + step * Math.ceil((k1 - k0) / step); // top of the axis on a labelled decade
  const ticks: number[] = [];
  // every step-th exponent from k0 up to k1
  for (let k = k0; k <= k1; k += step) ticks.push(decade(k));
  return { kind: 'log', lo: decade(k0), hi: decade(k1), ticks };
}

/** A step of 1, 2 or 5 × 10^k near range / target. */
function niceStep(range: number, target: number): number {
  const raw = range / target;
  const k = Math.floor(Math.log10(raw));
  const base = decade(k);
  const m = raw / base;
  return (m <= 1 ? 1 : m <= 2 ? 2 : m <= 5 ? 5 : 10) * base;
}

/** Linear axis over lo..hi widened to whole nice steps (a flat range gets ±1 or ±10 %). */
export function linearScale(lo: number, hi: number, target = 5): Scale {
  if (hi <= lo) {
    const pad = lo === 0 ? 1 : Math.abs(lo) * 0.1;
    lo -= pad;
    hi += pad;
  }
  const step = niceStep(hi - lo, target);
  const i0 = Math.floor(lo / step + 1e-9);
  const i1 = Math.ceil(hi / step - 1e-9);
  const ticks: number[] = [];
  // multiples of step from i0 to i1, rounded to shed binary noise
  for (let i = i0; i <= i1; i++) ticks.push(Number((i * step).toPrecision(12)));
  return { kind: 'linear', lo: ticks[0], hi: ticks[ticks.length - 1], ticks };
}

/** Log scale when the positive values span at least LOG_WHEN_DECADES decades, else linear from 0. */
export function valueScale(lo: number, hi: number): Scale {
  if (lo > 0 && hi / lo >= decade(LOG_WHEN_DECADES)) return logScale(lo, hi);
  return linearScale(Math.min(0, lo), hi);
}

/** Pixel position of v on the scale, between p0 (at lo) and p1 (at hi); clamped to the axis. */
export function toPixel(s: Scale, v: number, p0: number, p1: number): number {
  let t: number;
  if (s.kind === 'log') t = v > 0 ? (Math.log10(v) - Math.log10(s.lo)) / (Math.log10(s.hi) - Math.log10(s.lo)) : 0;
  else t = (v - s.lo) / (s.hi - s.lo);
  return p0 + Math.min(1, Math.max(0, t)) * (p1 - p0);
}

const SUPERSCRIPT: Record<string, string> = { '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };

/** `10⁻¹⁴` on a log axis; plain short numbers on a linear one. */
export function tickLabel(s: Scale, v: number): string {
  if (s.kind === 'log') {
    const k = Math.round(Math.log10(v));
    if (k >= 0 && k <= 3) return String(decade(k));
    return `10${String(k).replace(/./g, (c) => SUPERSCRIPT[c])}`;
  }
  if (v !== 0 && (Math.abs(v) < 1e-3 || Math.abs(v) >= 1e6)) return v.toExponential(0).replace('e+', 'e');
  return String(Number(v.toPrecision(6)));
}

/** Mode-number labels to show on a band axis of n modes: every 1, 2, 5, 10, … so ≤ ~16 remain. */
function modeTickStep(n: number): number {
  const steps = [1, 2, 5, 10, 20, 50, 100, 200, 500, 1000];
  return steps.find((s) => n / s <= 16) ?? Math.ceil(n / 16);
}

function px(x: number): string {
  return String(Math.round(x * 10) / 10);
}

// ---------------------------------------------------------------- frame (one size for every x–y chart)

const W = 640, H = 260, LEFT = 62, RIGHT = 16, TOP = 26, BOTTOM = H - 40;

export interface ReferenceLine {
  value: number;
  label: string;
}

/** What every x–y chart has: a title, the y axis and its label, dashed limit lines. */
export interface ChartBase {
  title: string;
  yLabel: string;
  y: Scale;
  lines?: ReferenceLine[];
}

/** Opening tag, gridlines and tick labels of the y axis, both axis lines, the titles. */
function frame(o: ChartBase, xLabel: string): string {
  const out = [`<svg xmlns="http://www.w3.org/2000/svg" class="plot" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" role="img" ${FONT}><title>${escapeText(o.title)}</title>`];
  // one gridline and label per tick
  for (const t of o.y.ticks) {
    const yy = px(yOf(o.y, t));
    out.push(`<line x1="${LEFT}" y1="${yy}" x2="${W - RIGHT}" y2="${yy}" stroke="${GRID}"/><text x="${LEFT - 5}" y="${yy}" text-anchor="end" dominant-baseline="middle" fill="${INK}">${escapeText(tickLabel(o.y, t))}</text>`);
  }
  out.push(`<path d="M${LEFT} ${TOP}V${BOTTOM}H${W - RIGHT}" fill="none" stroke="${INK}"/>`);
  out.push(`<text x="${LEFT}" y="15" font-size="12" font-weight="bold" fill="${INK}">${escapeText(o.title)}</text>`);
  out.push(`<text x="${px((LEFT + W - RIGHT) / 2)}" y="${H - 6}" text-anchor="middle" fill="${INK}">${escapeText(xLabel)}</text>`);
  out.push(`<text transform="translate(13 ${px((TOP + BOTTOM) / 2)}) rotate(-90)" text-anchor="middle" fill="${INK}">${escapeText(o.yLabel)}</text>`);
  return out.join('');
}

/** Y position of v. */
function yOf(s: Scale, v: number): number {
  return toPixel(s, v, BOTTOM, TOP);
}

/** Centre and width of band i (1-based) of n on the x axis. */
function band(i: number, n: number): { x: number; w: number } {
  const w = (W - LEFT - RIGHT) / Math.max(1, n);
  return { x: LEFT + (i - 0.5) * w, w };
}

/** Labels under bands 1, step, 2·step, … (mode numbers unless labels are given). */
function bandLabels(n: number, label: (i: number) => string = String): string {
  const step = modeTickStep(n);
  const out: string[] = [];
  // label band 1 and every step-th after it
  for (let i = 1; i <= n; i++) {
    if (i !== 1 && i % step !== 0) continue;
    const x = px(band(i, n).x);
    out.push(`<line x1="${x}" y1="${BOTTOM}" x2="${x}" y2="${BOTTOM + 4}" stroke="${INK}"/><text x="${x}" y="${BOTTOM + 15}" text-anchor="middle" fill="${INK}">${escapeText(label(i))}</text>`);
  }
  return out.join('');
}

/** Dashed horizontal lines at the given values, labelled at the right end; then the closing tag. */
function close(o: ChartBase, legendItems: { label: string; mark: string }[] = []): string {
  const out: string[] = [];
  // one dashed line per limit that the axis can show
  for (const l of o.lines ?? []) {
    if (!Number.isFinite(l.value) || (o.y.kind === 'log' && l.value <= 0)) continue;
    const yy = yOf(o.y, l.value);
    out.push(`<line x1="${LEFT}" y1="${px(yy)}" x2="${W - RIGHT}" y2="${px(yy)}" stroke="${FLAG}" stroke-width="1.5" stroke-dasharray="6 4"/><text x="${W - RIGHT - 2}" y="${px(yy - 4)}" text-anchor="end" fill="${FLAG}"${HALO}>${escapeText(l.label)}</text>`);
  }
  let x = W - RIGHT;
  // legend right-aligned on the title line, last item first
  for (const item of [...legendItems].reverse()) {
    x -= 18 + item.label.length * 6.2;
    out.push(`<g transform="translate(${px(x)} 10)">${item.mark}<text x="14" y="4" fill="${INK}">${escapeText(item.label)}</text></g>`);
  }
  return `${out.join('')}</svg>`;
}

// ---------------------------------------------------------------- stem chart (per mode)

export interface ModeValue {
  /** 1-based mode number (band position). */
  mode: number;
  value: number;
  /** Drawn on the axis floor with a hollow marker: rigid-body/near-zero modes, zeros on a log axis. */
  floor?: boolean;
  flagged?: boolean;
}

export interface StemChartOptions extends ChartBase {
  /** Number of mode bands (usually the modes solved). */
  modes: number;
  values: ModeValue[];
  /** Legend text for floor markers (no legend entry without it). */
  floorLabel?: string;
  /** Stems from the axis floor (frequencies); false draws markers joined by a line (residuals). */
  stems?: boolean;
}

const dot = (x: number, y: number, color: string) => `<circle cx="${px(x)}" cy="${px(y)}" r="3.5" fill="${color}"/>`;
const hollow = (x: number, y: number) => `<rect x="${px(x - 4)}" y="${px(y - 4)}" width="8" height="8" fill="#fff" stroke="${MUTED}" stroke-width="1.5" transform="rotate(45 ${px(x)} ${px(y)})"/>`;

/** One value per mode: stems (or joined markers), floor markers for near-zero values, limit lines. */
export function stemChart(o: StemChartOptions): string {
  const out = [frame(o, 'mode'), bandLabels(o.modes)];
  const plotted = o.values.filter((v) => v.floor || Number.isFinite(v.value));
  const pts = plotted.filter((v) => !v.floor).map((v) => `${px(band(v.mode, o.modes).x)},${px(yOf(o.y, v.value))}`);
  if (o.stems === false && pts.length > 1) out.push(`<polyline points="${pts.join(' ')}" fill="none" stroke="${BAR}"/>`);
  // one stem and marker per mode
  for (const v of plotted) {
    const { x } = band(v.mode, o.modes);
    if (v.floor) {
      out.push(hollow(x, BOTTOM));
      continue;
    }
    const y = yOf(o.y, v.value), color = v.flagged ? FLAG : BAR;
    if (o.stems !== false) out.push(`<line x1="${px(x)}" y1="${BOTTOM}" x2="${px(x)}" y2="${px(y)}" stroke="${color}" stroke-width="2"/>`);
    out.push(dot(x, y, color));
  }
  const showFloor = o.floorLabel !== undefined && plotted.some((v) => v.floor);
  return out.join('') + close(o, showFloor ? [{ label: o.floorLabel!, mark: hollow(4, 0) }] : []);
}

// ---------------------------------------------------------------- cumulative lines

export interface LineSeries {
  label: string;
  /** values[j] for mode j+1; null where the series has no value. */
  values: (number | null)[];
  /** Style slot 0..5 (default: its position): colours 0–2 solid, then the same colours dashed. */
  slot?: number;
}

/** Three colours, solid then dashed, so six series stay apart in grey print too. */
const SERIES_COLORS = ['#2f5d8c', '#c0711b', '#3d8b3d'];

export interface StepChartOptions extends ChartBase {
  modes: number;
  series: LineSeries[];
}

/** Step lines over the mode bands (a cumulative quantity after each mode), one per series. */
export function stepChart(o: StepChartOptions): string {
  const out = [frame(o, 'mode'), bandLabels(o.modes)];
  const style = (k: number, dash: string) => `stroke="${SERIES_COLORS[k % 3]}" stroke-width="2"${k % 6 >= 3 ? ` stroke-dasharray="${dash}"` : ''}`;
  o.series.forEach((s, i) => {
    const k = s.slot ?? i;
    const pts: string[] = [];
    // a flat segment across each mode's band at its value
    s.values.forEach((v, j) => {
      if (v === null || !Number.isFinite(v)) return;
      const { x, w } = band(j + 1, o.modes), y = px(yOf(o.y, v));
      pts.push(`${px(x - w / 2)},${y}`, `${px(x + w / 2)},${y}`);
    });
    if (pts.length > 0) out.push(`<polyline points="${pts.join(' ')}" fill="none" ${style(k, '5 3')}/>`);
  });
  return out.join('') + close(o, o.series.map((s, i) => ({ label: s.label, mark: `<line x1="0" y1="0" x2="11" y2="0" ${style(s.slot ?? i, '3 2')}/>` })));
}

// ---------------------------------------------------------------- signed bars

export interface Bar {
  label: string;
  /** null: no value (drawn as a grey tick on the zero line). */
  value: number | null;
  flagged?: boolean;
}

export interface BarChartOptions extends ChartBase {
  xLabel: string;
  bars: Bar[];
  nullLabel?: string;
}

/** Signed bars from zero, one per category, flagged ones in the warning colour. */
export function barChart(o: BarChartOptions): string {
  const n = o.bars.length;
  const y0 = yOf(o.y, 0);
  const out = [frame(o, o.xLabel), bandLabels(n, (i) => o.bars[i - 1].label), `<line x1="${LEFT}" y1="${px(y0)}" x2="${W - RIGHT}" y2="${px(y0)}" stroke="${INK}"/>`];
  // one bar per category
  o.bars.forEach((b, i) => {
    const { x, w } = band(i + 1, n);
    const bw = Math.max(1, Math.min(w * 0.7, 40));
    if (b.value === null || !Number.isFinite(b.value)) {
      out.push(`<line x1="${px(x - bw / 2)}" y1="${px(y0)}" x2="${px(x + bw / 2)}" y2="${px(y0)}" stroke="${MUTED}" stroke-width="3"/>`);
      return;
    }
    const y = yOf(o.y, b.value);
    out.push(`<rect x="${px(x - bw / 2)}" y="${px(Math.min(y, y0))}" width="${px(bw)}" height="${px(Math.max(0.5, Math.abs(y - y0)))}" fill="${b.flagged ? FLAG : BAR}"/>`);
  });
  const showNull = o.nullLabel !== undefined && o.bars.some((b) => b.value === null);
  return out.join('') + close(o, showNull ? [{ label: o.nullLabel!, mark: `<line x1="0" y1="0" x2="11" y2="0" stroke="${MUTED}" stroke-width="3"/>` }] : []);
}

// ---------------------------------------------------------------- heat map

export interface HeatMapOptions {
  title: string;
  rowLabel: string;
  colLabel: string;
  rows: number;
  cols: number;
  /** Row-major rows × cols values in 0..1. */
  values: readonly number[];
  /** Cells to outline (0-based row, column). */
  outlined?: [number, number][];
  /** Largest side of the matrix part in pixels. */
  maxSidePx?: number;
}

/** Cells bigger than this show their value (two decimals). */
const VALUE_CELL_PX = 26;

/** Grey level of a value in 0..1: white at 0, black at 1. */
export function greyOf(v: number): string {
  const g = Math.round(255 * (1 - Math.min(1, Math.max(0, v))));
  const h = g.toString(16).padStart(2, '0');
  return `#${h}${h}${h}`;
}

/** Rows × columns of 0..1 values as grey cells (values printed when the cells are large enough). */
export function heatMap(o: HeatMapOptions): string {
  const side = o.maxSidePx ?? 420;
  const cell = Math.max(4, Math.min(34, Math.floor(side / Math.max(o.rows, o.cols, 1))));
  const left = 58, top = 40, legendW = 70;
  const width = left + o.cols * cell + 20 + legendW, height = top + o.rows * cell + 40;
  const out = [`<svg xmlns="http://www.w3.org/2000/svg" class="plot" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" role="img" ${FONT}><title>${escapeText(o.title)}</title>`];
  out.push(`<text x="${left}" y="15" font-size="12" font-weight="bold" fill="${INK}">${escapeText(o.title)}</text>`);
  const showValues = cell >= VALUE_CELL_PX;
  // one grey cell per (row, column)
  for (let r = 0; r < o.rows; r++) {
    for (let c = 0; c < o.cols; c++) {
      const v = o.values[r * o.cols + c];
      const x = left + c * cell, y = top + r * cell;
      out.push(`<rect x="${x}" y="${y}" width="${cell}" height="${cell}" fill="${Number.isFinite(v) ? greyOf(v) : '#fff'}"/>`);
      if (showValues && Number.isFinite(v)) out.push(`<text x="${x + cell / 2}" y="${y + cell / 2}" text-anchor="middle" dominant-baseline="middle" font-size="9" fill="${v > 0.5 ? '#fff' : v < 0.005 ? MUTED : INK}">${v.toFixed(2)}</text>`);
    }
  }
  for (const [r, c] of o.outlined ?? []) out.push(`<rect x="${left + c * cell + 1}" y="${top + r * cell + 1}" width="${cell - 2}" height="${cell - 2}" fill="none" stroke="${FLAG}" stroke-width="${cell >= 8 ? 2 : 1}"/>`);
  out.push(`<rect x="${left}" y="${top}" width="${o.cols * cell}" height="${o.rows * cell}" fill="none" stroke="${INK}"/>`);
  const rowStep = modeTickStep(o.rows), colStep = modeTickStep(o.cols);
  // row labels (baseline modes) and column labels (current modes)
  for (let r = 1; r <= o.rows; r++) if (r === 1 || r % rowStep === 0) out.push(`<text x="${left - 4}" y="${top + (r - 0.5) * cell}" text-anchor="end" dominant-baseline="middle" fill="${INK}">${r}</text>`);
  for (let c = 1; c <= o.cols; c++) if (c === 1 || c % colStep === 0) out.push(`<text x="${left + (c - 0.5) * cell}" y="${top - 5}" text-anchor="middle" fill="${INK}">${c}</text>`);
  out.push(`<text x="${left + (o.cols * cell) / 2}" y="${top + o.rows * cell + 18}" text-anchor="middle" fill="${INK}">${escapeText(o.colLabel)} (columns)</text>`);
  out.push(`<text transform="translate(14 ${top + (o.rows * cell) / 2}) rotate(-90)" text-anchor="middle" fill="${INK}">${escapeText(o.rowLabel)} (rows)</text>`);
  out.push(greyLegend(left + o.cols * cell + 20, top));
  out.push('</svg>');
  return out.join('');
}

/** Eleven grey steps 0, 0.1, …, 1 with their values. */
function greyLegend(x: number, y: number): string {
  const out: string[] = [];
  // a stepped scale, 1 at the top
  for (let i = 0; i <= 10; i++) {
    const v = (10 - i) / 10;
    out.push(`<rect x="${x}" y="${y + i * 14}" width="16" height="14" fill="${greyOf(v)}" stroke="${GRID}" stroke-width="0.5"/>`);
    if (i % 5 === 0) out.push(`<text x="${x + 21}" y="${y + i * 14 + 7}" dominant-baseline="middle" fill="${INK}">${v.toFixed(1)}</text>`);
  }
  return out.join('');
}
