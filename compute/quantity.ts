/**
 * Quantities with units and first-order (linear) uncertainty propagation.
 *
 * Values are stored in base units per dimension: time in days, angle in radians,
 * frequency in cycles per day, angular rate in radians per day, length in km.
 *
 * Uncertainty is carried as a set of contributions, one per independent input:
 * `contrib[id] = (∂value/∂x_id) · σ_id`. The combined standard uncertainty is the
 * root-sum-square of the contributions (GUM, JCGM 100:2008, eq. 10 for uncorrelated
 * inputs). Keeping contributions per input (instead of one σ) makes expressions that
 * use the same input twice — `synodic(a, b) - a` — propagate correctly.
 */

export type Dimension = 'time' | 'angle' | 'frequency' | 'angular-rate' | 'length' | 'none';

export interface Quantity {
  /** Value in the base unit of its dimension. */
  readonly value: number;
  readonly dim: Dimension;
  /** Contribution of each independent input to the standard uncertainty, in base units. */
  readonly contrib: ReadonlyMap<string, number>;
}

export interface UnitDef {
  readonly name: string;
  readonly dim: Dimension;
  /** Multiply a value in this unit by `factor` to get base units. */
  readonly factor: number;
}

const DEG = Math.PI / 180;
/** Nominal solar radius, IAU 2015 Resolution B3: 695 700 km. */
export const NOMINAL_SOLAR_RADIUS_KM = 695_700;
/** Astronomical unit, IAU 2012 Resolution B2: 149 597 870.700 km. */
export const AU_KM = 149_597_870.7;
/** Julian year in days. */
export const JULIAN_YEAR_DAYS = 365.25;

const TIME_UNITS: Record<string, number> = {
  s: 1 / 86400, min: 1 / 1440, h: 1 / 24, d: 1, yr: JULIAN_YEAR_DAYS, kyr: 1000 * JULIAN_YEAR_DAYS,
};
const ANGLE_UNITS: Record<string, number> = {
  deg: DEG, '°': DEG, arcmin: DEG / 60, arcsec: DEG / 3600, rad: 1,
};
const LENGTH_UNITS: Record<string, number> = { km: 1, au: AU_KM, rsun: NOMINAL_SOLAR_RADIUS_KM };

/** Every unit spelling the language accepts, for completion and error hints. */
export const UNIT_NAMES: readonly string[] = [
  ...Object.keys(TIME_UNITS), ...Object.keys(ANGLE_UNITS), ...Object.keys(LENGTH_UNITS),
  ...Object.keys(TIME_UNITS).map((u) => `/${u}`), 'deg/d', 'deg/yr', 'rad/d', 'arcsec/yr',
];

/**
 * Look up a unit spelling: `d`, `yr`, `deg`, `°`, `/d`, `deg/d`, `km`, `rsun` …
 * @returns the unit, or `undefined` when the spelling is unknown.
 */
export function lookupUnit(spelling: string): UnitDef | undefined {
  const s = spelling.trim();
  if (Object.hasOwn(TIME_UNITS, s)) return { name: s, dim: 'time', factor: TIME_UNITS[s]! };
  if (Object.hasOwn(ANGLE_UNITS, s)) return { name: s, dim: 'angle', factor: ANGLE_UNITS[s]! };
  if (Object.hasOwn(LENGTH_UNITS, s)) return { name: s, dim: 'length', factor: LENGTH_UNITS[s]! };
  const slash = s.indexOf('/');
  if (slash >= 0) {
    const num = s.slice(0, slash).trim();
    const den = s.slice(slash + 1).trim();
    const denF = Object.hasOwn(TIME_UNITS, den) ? TIME_UNITS[den] : undefined;
    if (denF === undefined) return undefined;
    if (num === '' || num === '1') return { name: s, dim: 'frequency', factor: 1 / denF };
    const angF = Object.hasOwn(ANGLE_UNITS, num) ? ANGLE_UNITS[num] : undefined;
    if (angF !== undefined) return { name: s, dim: 'angular-rate', factor: angF / denF };
  }
  return undefined;
}

/** An exact quantity (no uncertainty) in base units. */
export function exact(value: number, dim: Dimension): Quantity {
  return { value, dim, contrib: new Map() };
}

/**
 * A measured input: value and standard uncertainty in base units, independent of every other input.
 * @param id a stable key; the same id used twice means the same input (fully correlated).
 */
export function measured(value: number, sigma: number, dim: Dimension, id: string): Quantity {
  const contrib = new Map<string, number>();
  if (sigma !== 0) contrib.set(id, Math.abs(sigma));
  return { value, dim, contrib };
}

/** Combined standard uncertainty in base units: √Σ contrib². */
export function sigmaOf(q: Quantity): number {
  let s = 0;
  for (const c of q.contrib.values()) s += c * c;
  return Math.sqrt(s);
}

/** Apply a function of one or more quantities given its value and partial derivatives. */
export function propagate(value: number, dim: Dimension, parts: ReadonlyArray<readonly [Quantity, number]>): Quantity {
  const contrib = new Map<string, number>();
  for (const [q, dfdq] of parts) {
    for (const [id, c] of q.contrib) contrib.set(id, (contrib.get(id) ?? 0) + dfdq * c);
  }
  return { value, dim, contrib };
}

export class DimensionError extends Error {
  constructor(message: string) { super(message); this.name = 'DimensionError'; }
}

function productDim(a: Dimension, b: Dimension, op: '*' | '/'): Dimension {
  if (op === '*') {
    if (a === 'none') return b;
    if (b === 'none') return a;
    if ((a === 'time' && b === 'frequency') || (a === 'frequency' && b === 'time')) return 'none';
    if ((a === 'time' && b === 'angular-rate') || (a === 'angular-rate' && b === 'time')) return 'angle';
  } else {
    if (b === 'none') return a;
    if (a === b) return 'none';
    if (a === 'none' && b === 'time') return 'frequency';
    if (a === 'none' && b === 'frequency') return 'time';
    if (a === 'angle' && b === 'time') return 'angular-rate';
    if (a === 'angle' && b === 'angular-rate') return 'time';
    if (a === 'angle' && b === 'frequency') return 'angle';
  }
  throw new DimensionError(`cannot ${op === '*' ? 'multiply' : 'divide'} ${describeDim(a)} ${op === '*' ? 'by' : 'by'} ${describeDim(b)}`);
}

export function describeDim(d: Dimension): string {
  switch (d) {
    case 'time': return 'a time';
    case 'angle': return 'an angle';
    case 'frequency': return 'a frequency';
    case 'angular-rate': return 'an angular rate';
    case 'length': return 'a length';
    case 'none': return 'a plain number';
  }
}

export function add(a: Quantity, b: Quantity, sign: 1 | -1 = 1): Quantity {
  if (a.dim !== b.dim) throw new DimensionError(`cannot ${sign > 0 ? 'add' : 'subtract'} ${describeDim(b.dim)} ${sign > 0 ? 'to' : 'from'} ${describeDim(a.dim)}`);
  return propagate(a.value + sign * b.value, a.dim, [[a, 1], [b, sign]]);
}

export function mul(a: Quantity, b: Quantity): Quantity {
  return propagate(a.value * b.value, productDim(a.dim, b.dim, '*'), [[a, b.value], [b, a.value]]);
}

export function div(a: Quantity, b: Quantity): Quantity {
  if (b.value === 0) throw new RangeError('division by zero');
  return propagate(a.value / b.value, productDim(a.dim, b.dim, '/'), [[a, 1 / b.value], [b, -a.value / (b.value * b.value)]]);
}

export function neg(a: Quantity): Quantity {
  return propagate(-a.value, a.dim, [[a, -1]]);
}

/** Period (days) ↔ frequency (cycles/day): f = 1/P, σ_f = σ_P / P². */
export function reciprocal(a: Quantity): Quantity {
  const dim: Dimension = a.dim === 'time' ? 'frequency' : a.dim === 'frequency' ? 'time' : a.dim === 'none' ? 'none' : (() => { throw new DimensionError(`cannot take the reciprocal of ${describeDim(a.dim)}`); })();
  if (a.value === 0) throw new RangeError('reciprocal of zero');
  return propagate(1 / a.value, dim, [[a, -1 / (a.value * a.value)]]);
}

/** Absolute value with its derivative sign. */
export function abs(a: Quantity): Quantity {
  return propagate(Math.abs(a.value), a.dim, [[a, a.value < 0 ? -1 : 1]]);
}

/** The unit the results are shown in by default for each dimension. */
export function defaultUnit(q: Quantity): UnitDef {
  switch (q.dim) {
    case 'time': {
      const days = Math.abs(q.value);
      if (days >= 2 * JULIAN_YEAR_DAYS) return { name: 'yr', dim: 'time', factor: JULIAN_YEAR_DAYS };
      if (days >= 1 || days === 0) return { name: 'd', dim: 'time', factor: 1 };
      if (days >= 1 / 24) return { name: 'h', dim: 'time', factor: 1 / 24 };
      return { name: 's', dim: 'time', factor: 1 / 86400 };
    }
    case 'angle': return { name: 'deg', dim: 'angle', factor: DEG };
    case 'frequency': return Math.abs(q.value) < 1 / 730.5 ? { name: '/yr', dim: 'frequency', factor: 1 / JULIAN_YEAR_DAYS } : { name: '/d', dim: 'frequency', factor: 1 };
    case 'angular-rate': return { name: 'deg/d', dim: 'angular-rate', factor: DEG };
    case 'length': return Math.abs(q.value) > 0.01 * AU_KM ? { name: 'au', dim: 'length', factor: AU_KM } : { name: 'km', dim: 'length', factor: 1 };
    case 'none': return { name: '', dim: 'none', factor: 1 };
  }
}

/**
 * Format a value with its uncertainty, rounding both to the uncertainty's two significant
 * digits (common practice, GUM 7.2.6). Exact values get `digits` significant digits.
 */
export function formatQuantity(q: Quantity, unit: UnitDef = defaultUnit(q), digits = 7): string {
  const v = q.value / unit.factor;
  const s = sigmaOf(q) / unit.factor;
  const u = unit.name === '' ? '' : unit.name.startsWith('/') ? ` ${unit.name}` : ` ${unit.name}`;
  // An exact value has no meaningful trailing zeros.
  if (!(s > 0) || !Number.isFinite(s)) return `${trimZeros(formatSig(v, digits))}${u}`;
  const decimals = Math.max(0, 1 - Math.floor(Math.log10(s)));
  if (decimals > 12) return `${formatSig(v, digits)} ± ${formatSig(s, 2)}${u}`;
  return `${v.toFixed(decimals).replace(/^-(0\.?0*)$/, '$1')} ± ${s.toFixed(decimals)}${u}`;
}

/** `2.500000` → `2.5`, `3.000` → `3` (exponent forms untouched). */
export function trimZeros(text: string): string {
  if (!text.includes('.') || /e/i.test(text)) return text;
  return text.replace(/\.?0+$/, '');
}

/** `x` to `n` significant digits without exponent notation for ordinary magnitudes. */
export function formatSig(x: number, n: number): string {
  if (x === 0 || !Number.isFinite(x)) return String(x);
  const mag = Math.floor(Math.log10(Math.abs(x)));
  if (mag < -5 || mag > 12) return x.toExponential(n - 1);
  const decimals = Math.max(0, n - 1 - mag);
  return x.toFixed(Math.min(decimals, 15));
}

/** Plain JSON form used by `run --json`: number and uncertainty in the display unit. */
export interface QuantityJson { number: number; unit: string; uncertainty: number }

export function toJson(q: Quantity, unit: UnitDef = defaultUnit(q)): QuantityJson {
  return { number: q.value / unit.factor, unit: unit.name, uncertainty: sigmaOf(q) / unit.factor };
}
