/** Diagnostics with stable codes. Computing them is pure; the extension publishes them. */
import type { Range } from './ast.js';

/** Stable codes: never renumber or reuse; add new ones at the end of their group. */
export enum Code {
  // Syntax: OB1xx
  UnknownStatement = 'OB101',
  UnexpectedToken = 'OB102',
  MissingArgument = 'OB103',
  BadNumber = 'OB104',
  UnknownUnit = 'OB105',
  MissingUnit = 'OB106',
  BadDate = 'OB107',
  BadOption = 'OB108',
  UnclosedString = 'OB109',
  UnclosedFence = 'OB110',
  // Names: OB2xx
  UnknownName = 'OB201',
  Redefinition = 'OB202',
  UnknownBody = 'OB203',
  NoEphemeris = 'OB204',
  DependsOnError = 'OB205',
  // Meaning: OB3xx
  DimensionMismatch = 'OB301',
  OutOfRange = 'OB302',
  NotAvailable = 'OB303',
  NoneInWindow = 'OB304',
  // Limits and runtime: OB4xx
  LimitReached = 'OB401',
  Cancelled = 'OB402',
  DataFile = 'OB403',
  OutsideWorkspace = 'OB404',
  Internal = 'OB405',
  // Accuracy and write-back warnings: OB5xx
  EphemerisAccuracy = 'OB501',
  RegionEdited = 'OB502',
  RegionStale = 'OB503',
  RegionMissing = 'OB504',
}

export type Severity = 'error' | 'warning' | 'information';

export interface Diagnostic {
  readonly code: Code;
  readonly severity: Severity;
  readonly message: string;
  readonly range: Range;
}

export function diag(code: Code, severity: Severity, message: string, range: Range): Diagnostic {
  return { code, severity, message, range };
}

/** Levenshtein distance, for "did you mean" hints (common practice). */
export function editDistance(a: string, b: string): number {
  const prev = new Array<number>(b.length + 1);
  for (let j = 0; j <= b.length; j++) prev[j] = j;
  for (let i = 1; i <= a.length; i++) {
    let diagPrev = prev[0]!;
    prev[0] = i;
    for (let j = 1; j <= b.length; j++) {
      const tmp = prev[j]!;
      prev[j] = Math.min(prev[j]! + 1, prev[j - 1]! + 1, diagPrev + (a[i - 1] === b[j - 1] ? 0 : 1));
      diagPrev = tmp;
    }
  }
  return prev[b.length]!;
}

/** The closest candidate within a small edit distance, for "did you mean `x`?". */
export function suggest(word: string, candidates: Iterable<string>): string | undefined {
  let best: string | undefined;
  let bestD = Infinity;
  const limit = Math.max(1, Math.floor(word.length / 3));
  for (const c of candidates) {
    const d = editDistance(word.toLowerCase(), c.toLowerCase());
    if (d < bestD && d <= limit) { best = c; bestD = d; }
  }
  return best;
}
