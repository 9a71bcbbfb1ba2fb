/**
 * PlotSpec → a self-contained SVG string. Scales and ticks come from `d3-scale`, line paths
 * from `d3-shape`; this module only lays them out.
 *
 * Theme-aware: every colour is `currentColor` or a VS Code theme variable with a fallback
 * (`var(--vscode-charts-blue, #1f77b4)`), so the same markup follows the editor's theme in the
 * preview and still reads in a standalone page. Every piece of text is XML-escaped.
 * Pure: no DOM, no I/O.
 */
import { scaleLinear, scaleLog, type ScaleContinuousNumeric } from 'd3-scale';
import { line } from 'd3-shape';
import type { PlotSpec } from '../result.js';

export interface SvgOptions {
  /** Width in CSS pixels (the drawing scales with its container through the viewBox); default 640. */
  readonly width?: number;
  /** Height in CSS pixels; default 320 (the `path` kind is square by default). */
  readonly height?: number;
}

/** Escape text for XML element content and attribute values. */
export function escapeXml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => (c === '&' ? '&amp;' : c === '<' ? '&lt;' : c === '>' ? '&gt;' : c === '"' ? '&quot;' : '&apos;'))
    // Characters XML 1.0 forbids even when escaped.
    // eslint-disable-next-line no-control-regex
    .replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/g, '');
}

/** Series colours: VS Code chart theme colours with the usual categorical fallbacks. */
const PALETTE = [
  'var(--vscode-charts-blue, #1f77b4)', 'var(--vscode-charts-orange, #ff7f0e)', 'var(--vscode-charts-green, #2ca02c)',
  'var(--vscode-charts-red, #d62728)', 'var(--vscode-charts-purple, #9467bd)', 'var(--vscode-charts-yellow, #bcbd22)',
];
const MARKER_COLOUR = 'var(--vscode-charts-red, #d62728)';
const SPAN_COLOUR = 'var(--vscode-charts-green, #2ca02c)';

type Scale = ScaleContinuousNumeric<number, number>;

const n1 = (x: number): string => (Math.round(x * 10) / 10).toString();

function extent(values: Iterable<number>, positiveOnly: boolean): [number, number] | undefined {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v) || (positiveOnly && !(v > 0))) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (lo > hi) return undefined;
  if (lo === hi) {
    const pad = lo === 0 ? 1 : Math.abs(lo) * 0.05;
    return positiveOnly ? [lo / 1.1, hi * 1.1] : [lo - pad, hi + pad];
  }
  return [lo, hi];
}

function* allX(spec: PlotSpec): Iterable<number> {
  for (const s of spec.series) yield* s.x;
  for (const sp of spec.spans ?? []) { yield sp.x0; yield sp.x1; }
}

function* allY(spec: PlotSpec): Iterable<number> {
  for (const s of spec.series) yield* s.y;
}

/**
 * Points of one series in pixels, thinned to at most a first/min/max/last per pixel column so a
 * 10⁵-point periodogram keeps every peak's height but not 10⁵ path segments.
 */
function pixelPoints(xs: readonly number[], ys: readonly number[], x: Scale, y: Scale, xLog: boolean): Array<[number, number] | null> {
  const out: Array<[number, number] | null> = [];
  const len = Math.min(xs.length, ys.length);
  let col = NaN;
  let bucket: Array<[number, number]> = [];
  const flush = (): void => {
    if (bucket.length <= 4) { out.push(...bucket); bucket = []; return; }
    let lo = bucket[0]!;
    let hi = bucket[0]!;
    for (const p of bucket) { if (p[1] < lo[1]) lo = p; if (p[1] > hi[1]) hi = p; }
    const mid = lo[0] <= hi[0] ? [lo, hi] : [hi, lo];
    out.push(bucket[0]!, ...mid, bucket[bucket.length - 1]!);
    bucket = [];
  };
  for (let i = 0; i < len; i++) {
    const xv = xs[i]!;
    const yv = ys[i]!;
    if (!Number.isFinite(xv) || !Number.isFinite(yv) || (xLog && !(xv > 0))) { flush(); out.push(null); col = NaN; continue; }
    const px = x(xv);
    const py = y(yv);
    const c = Math.floor(px);
    if (c !== col) { flush(); col = c; }
    bucket.push([px, py]);
  }
  flush();
  return out;
}

/** Tick marks, labels and grid lines of one axis. */
function axis(scale: Scale, orient: 'bottom' | 'left', plotLeft: number, plotTop: number, plotW: number, plotH: number, ticks: readonly number[] | undefined, log = false): string {
  const count = orient === 'bottom' ? 7 : 5;
  const values = ticks ?? scale.ticks(count);
  // No thousands separators (years, Julian Dates); the log scale keeps d3's label thinning.
  const fmt = scale.tickFormat(count, log ? '~g' : '~f');
  const parts: string[] = [`<g class="orbit-axis orbit-axis-${orient === 'bottom' ? 'x' : 'y'}">`];
  if (orient === 'bottom') {
    const y0 = plotTop + plotH;
    parts.push(`<line class="orbit-axis-line" x1="${n1(plotLeft)}" y1="${n1(y0)}" x2="${n1(plotLeft + plotW)}" y2="${n1(y0)}" style="stroke: currentColor"/>`);
    for (const v of values) {
      const px = scale(v);
      if (!Number.isFinite(px) || px < plotLeft - 0.5 || px > plotLeft + plotW + 0.5) continue;
      parts.push(`<line class="orbit-grid" x1="${n1(px)}" y1="${n1(plotTop)}" x2="${n1(px)}" y2="${n1(y0)}" style="stroke: currentColor; stroke-opacity: 0.12"/>`);
      parts.push(`<line class="orbit-tick" x1="${n1(px)}" y1="${n1(y0)}" x2="${n1(px)}" y2="${n1(y0 + 4)}" style="stroke: currentColor"/>`);
      const label = ticks ? String(v) : fmt(v);
      if (label !== '') parts.push(`<text class="orbit-tick-label" x="${n1(px)}" y="${n1(y0 + 15)}" text-anchor="middle">${escapeXml(label)}</text>`);
    }
  } else {
    parts.push(`<line class="orbit-axis-line" x1="${n1(plotLeft)}" y1="${n1(plotTop)}" x2="${n1(plotLeft)}" y2="${n1(plotTop + plotH)}" style="stroke: currentColor"/>`);
    for (const v of values) {
      const py = scale(v);
      if (!Number.isFinite(py) || py < plotTop - 0.5 || py > plotTop + plotH + 0.5) continue;
      parts.push(`<line class="orbit-grid" x1="${n1(plotLeft)}" y1="${n1(py)}" x2="${n1(plotLeft + plotW)}" y2="${n1(py)}" style="stroke: currentColor; stroke-opacity: 0.12"/>`);
      parts.push(`<line class="orbit-tick" x1="${n1(plotLeft - 4)}" y1="${n1(py)}" x2="${n1(plotLeft)}" y2="${n1(py)}" style="stroke: currentColor"/>`);
      const label = ticks ? String(v) : fmt(v);
      if (label !== '') parts.push(`<text class="orbit-tick-label" x="${n1(plotLeft - 7)}" y="${n1(py + 3.5)}" text-anchor="end">${escapeXml(label)}</text>`);
    }
  }
  parts.push('</g>');
  return parts.join('');
}

/**
 * Render a plot. Kinds: `line` and `periodogram` draw lines (a periodogram's y axis starts at 0;
 * `xLog` gives a logarithmic x axis, non-positive x are then dropped), `scatter` and `timeline`
 * draw points (a timeline's y axis is longitude, fixed to 0–360°), `path` draws x–y curves with
 * equal scales on both axes, `windows` shades each span. Markers (vertical lines) and spans are
 * drawn for any kind. Non-finite values are skipped (they break a line).
 * @returns an `<svg>` element as text; a plot without drawable data says so inside the frame.
 */
export function renderSvg(spec: PlotSpec, options: SvgOptions = {}): string {
  const width = options.width ?? 640;
  const height = options.height ?? (spec.kind === 'path' ? width : 320);
  const margin = { top: 30, right: 18, bottom: 44, left: 62 };
  const plotLeft = margin.left;
  const plotTop = margin.top;
  const plotW = width - margin.left - margin.right;
  const plotH = height - margin.top - margin.bottom;
  const xLog = spec.xLog === true;

  const title = escapeXml(spec.title);
  const head = `<svg xmlns="http://www.w3.org/2000/svg" class="orbit-plot orbit-plot-${spec.kind}" viewBox="0 0 ${width} ${height}" width="${width}" height="${height}" role="img" aria-label="${title}" style="color: var(--vscode-editor-foreground, #333); font-family: var(--vscode-font-family, sans-serif); font-size: 11px; max-width: 100%; height: auto">`;
  const parts: string[] = [head, `<title>${title}</title>`,
    `<text class="orbit-plot-title" x="${n1(width / 2)}" y="18" text-anchor="middle" style="font-size: 13px; fill: currentColor">${title}</text>`];

  let xd = extent(allX(spec), xLog);
  let yd = extent(allY(spec), false);
  if (spec.kind === 'windows' && !yd) yd = [0, 1];
  if (!xd || !yd) {
    parts.push(`<rect class="orbit-frame" x="${plotLeft}" y="${plotTop}" width="${plotW}" height="${plotH}" style="fill: none; stroke: currentColor; stroke-opacity: 0.3"/>`,
      `<text class="orbit-empty" x="${n1(width / 2)}" y="${n1(plotTop + plotH / 2)}" text-anchor="middle" style="fill: currentColor">no data to plot</text>`, '</svg>');
    return parts.join('');
  }
  let yTicks: number[] | undefined;
  if (spec.kind === 'periodogram') yd = [Math.min(0, yd[0]), yd[1] > 0 ? yd[1] * 1.05 : 1];
  if (spec.kind === 'timeline') { yd = [0, 360]; yTicks = [0, 90, 180, 270, 360]; }
  if (spec.kind === 'path') {
    // Equal scales: widen the narrower extent, then fit the square-ish plot area.
    const cx = (xd[0] + xd[1]) / 2;
    const cy = (yd[0] + yd[1]) / 2;
    const half = Math.max(xd[1] - xd[0], yd[1] - yd[0]) / 2 * 1.05;
    xd = [cx - half * Math.max(1, plotW / plotH), cx + half * Math.max(1, plotW / plotH)];
    yd = [cy - half * Math.max(1, plotH / plotW), cy + half * Math.max(1, plotH / plotW)];
  }
  const x: Scale = xLog ? scaleLog().domain(xd).range([plotLeft, plotLeft + plotW]) : scaleLinear().domain(xd).range([plotLeft, plotLeft + plotW]);
  // A log axis keeps its data extent: rounding it out to decades can waste most of the width.
  if (spec.kind !== 'path' && !xLog) x.nice();
  const y: Scale = scaleLinear().domain(yd).range([plotTop + plotH, plotTop]);
  if (spec.kind !== 'path' && spec.kind !== 'timeline') y.nice();

  // Ids must be unique on a page holding several plots: derive one from the plot's content.
  const fingerprint = spec.series.map((s) => `${s.x.length}:${s.x[0]}:${s.y[0]}:${s.y[s.y.length - 1]}`).join(';');
  const clipId = `orbit-clip-${(hashText(`${spec.kind}|${spec.title}|${width}x${height}|${fingerprint}`) >>> 0).toString(36)}`;
  parts.push(`<defs><clipPath id="${clipId}"><rect x="${plotLeft}" y="${plotTop}" width="${plotW}" height="${plotH}"/></clipPath></defs>`);

  // Spans first, under everything else.
  if (spec.spans && spec.spans.length > 0) {
    parts.push(`<g class="orbit-spans" clip-path="url(#${clipId})">`);
    for (const sp of spec.spans) {
      const a = x(sp.x0);
      const b = x(sp.x1);
      if (!Number.isFinite(a) || !Number.isFinite(b)) continue;
      const left = Math.min(a, b);
      const w = Math.max(Math.abs(b - a), 1);
      parts.push(`<rect class="orbit-span" x="${n1(left)}" y="${plotTop}" width="${n1(w)}" height="${plotH}" style="fill: ${SPAN_COLOUR}; fill-opacity: 0.25"><title>${escapeXml(sp.label)}</title></rect>`);
    }
    parts.push('</g>');
  }

  parts.push(axis(x, 'bottom', plotLeft, plotTop, plotW, plotH, undefined, xLog));
  parts.push(axis(y, 'left', plotLeft, plotTop, plotW, plotH, yTicks));
  parts.push(`<text class="orbit-axis-label" x="${n1(plotLeft + plotW / 2)}" y="${n1(height - 8)}" text-anchor="middle" style="fill: currentColor">${escapeXml(spec.xLabel)}</text>`);
  parts.push(`<text class="orbit-axis-label" transform="translate(14 ${n1(plotTop + plotH / 2)}) rotate(-90)" text-anchor="middle" style="fill: currentColor">${escapeXml(spec.yLabel)}</text>`);

  const asPoints = spec.kind === 'scatter' || spec.kind === 'timeline';
  parts.push(`<g class="orbit-data" clip-path="url(#${clipId})">`);
  spec.series.forEach((s, i) => {
    const colour = PALETTE[i % PALETTE.length]!;
    if (asPoints) {
      parts.push(`<g class="orbit-series orbit-series-${i}" style="fill: ${colour}">`);
      const len = Math.min(s.x.length, s.y.length);
      for (let k = 0; k < len; k++) {
        const px = x(s.x[k]!);
        const py = y(s.y[k]!);
        if (Number.isFinite(px) && Number.isFinite(py)) parts.push(`<circle cx="${n1(px)}" cy="${n1(py)}" r="2.5"/>`);
      }
      parts.push('</g>');
    } else {
      const pts = pixelPoints(s.x, s.y, x, y, xLog);
      const d = line<[number, number] | null>().defined((p) => p !== null).x((p) => p![0]).y((p) => p![1]).digits(1)(pts) ?? '';
      if (d !== '') parts.push(`<path class="orbit-series orbit-series-${i}" d="${d}" style="fill: none; stroke: ${colour}; stroke-width: 1.4; stroke-linejoin: round"/>`);
    }
  });
  parts.push('</g>');

  if (spec.markers && spec.markers.length > 0) {
    parts.push('<g class="orbit-markers">');
    spec.markers.forEach((m, i) => {
      const px = x(m.x);
      if (!Number.isFinite(px) || px < plotLeft || px > plotLeft + plotW) return;
      const ty = plotTop + 10 + (i % 3) * 11;
      parts.push(`<line class="orbit-marker" x1="${n1(px)}" y1="${plotTop}" x2="${n1(px)}" y2="${plotTop + plotH}" style="stroke: ${MARKER_COLOUR}; stroke-dasharray: 4 3; stroke-width: 1.2"><title>${escapeXml(m.label)}</title></line>`);
      const anchor = px > plotLeft + plotW * 0.8 ? 'end' : 'start';
      parts.push(`<text class="orbit-marker-label" x="${n1(px + (anchor === 'start' ? 3 : -3))}" y="${n1(ty)}" text-anchor="${anchor}" style="fill: ${MARKER_COLOUR}">${escapeXml(m.label)}</text>`);
    });
    parts.push('</g>');
  }

  if (spec.series.length > 1) {
    parts.push('<g class="orbit-legend">');
    spec.series.forEach((s, i) => {
      const ly = plotTop + 6 + i * 14;
      const lx = plotLeft + plotW - 130;
      parts.push(`<rect x="${n1(lx)}" y="${n1(ly)}" width="10" height="10" style="fill: ${PALETTE[i % PALETTE.length]!}"/>`,
        `<text x="${n1(lx + 14)}" y="${n1(ly + 9)}" style="fill: currentColor">${escapeXml(s.label)}</text>`);
    });
    parts.push('</g>');
  }
  parts.push('</svg>');
  return parts.join('');
}

/** A small string hash (FNV-1a, 32 bits) so clip-path ids of plots on one page rarely collide. */
function hashText(s: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < s.length; i++) { h ^= s.charCodeAt(i); h = Math.imul(h, 0x01000193); }
  return h | 0;
}
