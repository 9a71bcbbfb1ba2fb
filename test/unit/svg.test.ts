import { strict as assert } from 'node:assert';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { escapeXml, renderSvg } from '../../compute/render/svg.js';
import type { PlotSpec } from '../../compute/result.js';

const HOSTILE = '<script>alert("x")</script> & \'q\'';

/** Every text node of the parsed SVG, in document order. */
function texts(svg: string): string[] {
  const out: string[] = [];
  const walk = (node: unknown): void => {
    if (Array.isArray(node)) { node.forEach(walk); return; }
    if (node && typeof node === 'object') {
      for (const [k, v] of Object.entries(node)) {
        if (k === '#text') out.push(String(v));
        else if (k !== ':@') walk(v);
      }
    }
  };
  walk(new XMLParser({ preserveOrder: true, ignoreAttributes: false, processEntities: true, htmlEntities: false }).parse(svg));
  return out;
}

function tickLabels(svg: string, axis: 'x' | 'y'): string[] {
  const g = new RegExp(`<g class="orbit-axis orbit-axis-${axis}">(.*?)</g>`).exec(svg)![1]!;
  return [...g.matchAll(/<text class="orbit-tick-label"[^>]*>([^<]*)<\/text>/g)].map((m) => m[1]!);
}

/** The coordinates of every path command of the data paths. */
function pathPoints(svg: string): Array<[number, number]> {
  const pts: Array<[number, number]> = [];
  for (const m of svg.matchAll(/<path class="orbit-series[^"]*" d="([^"]*)"/g)) {
    for (const p of m[1]!.matchAll(/[ML](-?[\d.]+),(-?[\d.]+)/g)) pts.push([Number(p[1]), Number(p[2])]);
  }
  return pts;
}

const base = (over: Partial<PlotSpec>): PlotSpec => ({
  kind: 'line', title: 't', xLabel: 'x', yLabel: 'y',
  series: [{ label: 's', x: [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10], y: [0, 1, 4, 9, 16, 25, 36, 49, 64, 81, 100] }], ...over,
});

describe('SVG plots', () => {
  it('is well-formed XML for every kind of plot', () => {
    const kinds: PlotSpec['kind'][] = ['line', 'scatter', 'periodogram', 'timeline', 'path', 'windows'];
    for (const kind of kinds) {
      const svg = renderSvg(base({ kind, markers: [{ x: 5, label: 'm' }], spans: [{ x0: 2, x1: 3, label: 'w' }] }));
      const ok = XMLValidator.validate(svg);
      assert.equal(ok, true, `${kind}: ${JSON.stringify(ok)}`);
      assert.match(svg, /^<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg" class="orbit-plot orbit-plot-/);
    }
  });

  it('escapes markup in the title, axis labels, series labels, markers and spans', () => {
    const svg = renderSvg(base({
      title: HOSTILE, xLabel: HOSTILE, yLabel: HOSTILE, markers: [{ x: 1.5, label: HOSTILE }], spans: [{ x0: 0.5, x1: 1, label: HOSTILE }],
      series: [{ label: HOSTILE, x: [0, 1, 2], y: [1, 2, 3] }, { label: 'b', x: [0, 2], y: [2, 1] }],
    }));
    assert.equal(XMLValidator.validate(svg), true);
    assert.ok(!svg.includes('<script'), 'raw <script> in output');
    const all = texts(svg);
    // Title element, visible title, x label, y label, marker label, span tooltip, marker tooltip, legend.
    assert.ok(all.filter((t) => t === HOSTILE).length >= 8, JSON.stringify(all));
    assert.equal(escapeXml('a\u0001b'), 'ab');
  });

  it('labels ticks from d3-scale: 0, 20 … 100 on a linear axis and decades on a log axis', () => {
    const lin = renderSvg(base({}));
    assert.deepEqual(tickLabels(lin, 'y'), ['0', '20', '40', '60', '80', '100']);
    assert.deepEqual(tickLabels(lin, 'x'), ['0', '2', '4', '6', '8', '10']);
    const log = renderSvg(base({ kind: 'periodogram', xLog: true, series: [{ label: 'p', x: [1, 3, 10, 30, 100], y: [0.1, 0.5, 0.2, 0.9, 0.3] }] }));
    const xl = tickLabels(log, 'x');
    for (const d of ['1', '10', '100']) assert.ok(xl.includes(d), JSON.stringify(xl));
    assert.equal(tickLabels(log, 'y')[0], '0');
    const years = renderSvg(base({ series: [{ label: 'y', x: [1750, 2000], y: [1, 2] }] }));
    assert.ok(tickLabels(years, 'x').includes('1800'), 'years without thousands separators');
  });

  it('drops non-positive x on a log axis and breaks a line at missing values', () => {
    const svg = renderSvg(base({ xLog: true, series: [{ label: 's', x: [0, 1, 2, NaN, 4, 8], y: [5, 1, 2, 3, 4, 5] }] }));
    const d = /<path class="orbit-series[^"]*" d="([^"]*)"/.exec(svg)![1]!;
    assert.equal((d.match(/M/g) ?? []).length, 2, d);
  });

  it('draws a timeline with longitude ticks 0, 90, 180, 270, 360 and one point per event', () => {
    const svg = renderSvg({ kind: 'timeline', title: 'conjunctions', xLabel: 'year', yLabel: 'longitude (deg)', series: [{ label: 'ev', x: [2000, 2020, 2040], y: [10, 200, 350] }] });
    assert.deepEqual(tickLabels(svg, 'y'), ['0', '90', '180', '270', '360']);
    assert.equal((svg.match(/<circle /g) ?? []).length, 3);
  });

  it('keeps equal scales on both axes for a path in the plane (a circle stays round)', () => {
    const n = 360;
    const x = Array.from({ length: n + 1 }, (_, i) => 2 * Math.cos(2 * Math.PI * i / n));
    const y = Array.from({ length: n + 1 }, (_, i) => 2 * Math.sin(2 * Math.PI * i / n));
    const svg = renderSvg({ kind: 'path', title: 'orbit', xLabel: 'x (au)', yLabel: 'y (au)', series: [{ label: 'c', x, y }] }, { width: 500, height: 300 });
    const pts = pathPoints(svg);
    const w = Math.max(...pts.map((p) => p[0])) - Math.min(...pts.map((p) => p[0]));
    const h = Math.max(...pts.map((p) => p[1])) - Math.min(...pts.map((p) => p[1]));
    const tolerancePx = 1;
    assert.ok(Math.abs(w - h) <= tolerancePx, `width ${w} px, height ${h} px`);
  });

  it('thins a 10⁵-point periodogram to a few points per pixel column but keeps the peak height', () => {
    const n = 100_000;
    const x = Array.from({ length: n }, (_, i) => 1 + i * 1e-3);
    const y = x.map((v) => (Math.abs(v - 57.3) < 5e-4 ? 1 : 0.2 + 0.1 * Math.sin(v * 40)));
    const svg = renderSvg({ kind: 'periodogram', title: 'p', xLabel: 'period', yLabel: 'power', series: [{ label: 'p', x, y }] });
    const pts = pathPoints(svg);
    assert.ok(pts.length <= 4 * 640, `${pts.length} points`);
    // The single high sample must still reach the top of the data (smallest pixel y).
    const top = Math.min(...pts.map((p) => p[1]));
    const yOfOne = Number(/<g class="orbit-axis orbit-axis-y">.*?y1="([\d.]+)"[^>]*\/><line class="orbit-tick"[^>]*\/><text class="orbit-tick-label"[^>]*>1</.exec(svg)?.[1] ?? NaN);
    assert.ok(Math.abs(top - yOfOne) <= 0.1, `peak at ${top} px, 1 at ${yOfOne} px`);
  });

  it('shades windows and draws dashed markers with labels', () => {
    const svg = renderSvg({ kind: 'windows', title: 'alignments', xLabel: 'year', yLabel: '', series: [], spans: [{ x0: 2000, x1: 2001, label: 'w1' }, { x0: 2010, x1: 2012, label: 'w2' }], markers: [{ x: 2005, label: 'mid' }] });
    assert.equal((svg.match(/<rect class="orbit-span"/g) ?? []).length, 2);
    assert.match(svg, /class="orbit-marker"[^>]*stroke-dasharray/);
    assert.ok(texts(svg).includes('mid'));
  });

  it('follows the editor theme through currentColor and VS Code variables with fallbacks', () => {
    const svg = renderSvg(base({}));
    assert.match(svg, /color: var\(--vscode-editor-foreground, #333\)/);
    assert.match(svg, /stroke: var\(--vscode-charts-blue, #1f77b4\)/);
    // No colour is fixed outside a var() fallback.
    const colours = [...svg.matchAll(/(?:fill|stroke):\s*([^;"]+)/g)].map((m) => m[1]!.trim());
    for (const c of colours) assert.ok(c === 'none' || c === 'currentColor' || c.startsWith('var(--vscode-'), c);
  });

  it('says there is no data to plot instead of drawing an empty frame silently', () => {
    const svg = renderSvg(base({ series: [{ label: 's', x: [], y: [] }] }));
    assert.equal(XMLValidator.validate(svg), true);
    assert.ok(texts(svg).includes('no data to plot'));
  });

  it('gives plots with different data different clip-path ids', () => {
    const a = /clipPath id="([^"]+)"/.exec(renderSvg(base({})))![1];
    const b = /clipPath id="([^"]+)"/.exec(renderSvg(base({ series: [{ label: 's', x: [0, 1], y: [3, 4] }] })))![1];
    assert.notEqual(a, b);
  });
});
