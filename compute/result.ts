/**
 * The one results model. Inline text, hover, preview HTML, written-back Markdown and
 * CLI output are all renderings of a {@link StatementResult}.
 */
import type { QuantityJson } from './quantity.js';

/** A plain table; cells are already formatted text (renderers escape them). */
export interface Table {
  readonly title?: string;
  readonly columns: readonly string[];
  readonly rows: ReadonlyArray<readonly string[]>;
  /** Per column: 'l' (text) or 'r' (numbers). Defaults to 'l'. */
  readonly align?: ReadonlyArray<'l' | 'r'>;
}

/** One found event of a search, for `run --json` and plots. */
export interface EventRecord {
  /** Julian Date in Terrestrial Time. */
  readonly jd_tt: number;
  /** ISO 8601 UTC text, e.g. `2020-12-21T18:20:31Z` (astronomical year numbering). */
  readonly utc: string;
  /** The event's numbers (separation in degrees, distance in au, …), named with units. */
  readonly fields: Readonly<Record<string, number | string>>;
}

/** Where a number came from: enough to regenerate and to judge it. */
export interface Provenance {
  /** e.g. `astronomy-engine 2.1.19`. */
  readonly libraries: readonly string[];
  /** e.g. `TT for positions; UTC shown`. */
  readonly timeScale?: string;
  /** e.g. `ΔT = 69.2 s (astronomy-engine polynomial, Espenak & Meeus 2006)`. */
  readonly deltaT?: string;
  /** e.g. `heliocentric, ecliptic of date`. */
  readonly frame?: string;
  /** e.g. `truncated VSOP87: good to ~1′ in 1000–3000`. */
  readonly validity?: string;
  /** e.g. `seed 42, 10000 trials`. */
  readonly random?: string;
}

/** A plot, described as data; the renderer turns it into SVG. */
export interface PlotSpec {
  readonly kind: 'line' | 'scatter' | 'periodogram' | 'timeline' | 'path' | 'windows';
  readonly title: string;
  readonly xLabel: string;
  readonly yLabel: string;
  readonly series: ReadonlyArray<{ readonly label: string; readonly x: readonly number[]; readonly y: readonly number[] }>;
  /** Vertical marker lines (e.g. computed periods on a periodogram). */
  readonly markers?: ReadonlyArray<{ readonly x: number; readonly label: string }>;
  /** Horizontal spans (e.g. alignment windows), in x units. */
  readonly spans?: ReadonlyArray<{ readonly x0: number; readonly x1: number; readonly label: string }>;
  readonly xLog?: boolean;
}

export interface StatementResult {
  /** The statement keyword: `date`, `synodic`, `conjunctions`, … */
  readonly kind: string;
  /** One line, shown at the end of the statement's line in the editor. */
  readonly summary: string;
  /** Markdown-free lines for the hover: formula, inputs, method. */
  readonly details: readonly string[];
  readonly tables: readonly Table[];
  readonly provenance: Provenance;
  /** Cautions a careful practitioner would print (solar glare, cycles are not forecasts). */
  readonly cautions: readonly string[];
  /** When the result is a quantity. */
  readonly value?: QuantityJson;
  /** When the result is a search. */
  readonly events?: readonly EventRecord[];
  readonly plots?: readonly PlotSpec[];
  /** Warnings shown as diagnostics on the statement (e.g. ephemeris accuracy, `OB501`). */
  readonly warnings?: ReadonlyArray<{ readonly code: string; readonly message: string }>;
}
