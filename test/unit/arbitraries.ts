/**
 * fast-check arbitraries of `orbit` block text: valid statements, valid blocks (with
 * comments, blank lines and continuation lines), mutated blocks and random text.
 * Shared by the parser's property test and the evaluator's.
 */
import fc from 'fast-check';
import { STATEMENT_KEYWORDS } from '../../language/ast.js';
import { suggest } from '../../language/diagnostics.js';
import { FUNCTIONS, isUnit, OPTION_WORDS, unitHint } from '../../language/parser.js';

const BUILTIN = ['sun', 'moon', 'mercury', 'venus', 'earth', 'mars', 'jupiter', 'saturn', 'uranus', 'neptune', 'pluto', 'ssb'];

/**
 * A name that the parser can never mistake for something else: not an option word, a
 * keyword or a function, and not one edit away from an option word (which an operand list
 * would read as a mistyped option when a number follows), and no unit or near-unit (which
 * could be read as the unit of an uncertainty before it: `3 d ± 0.1 dg`).
 */
export const arbName: fc.Arbitrary<string> = fc.oneof(
  fc.constantFrom(...BUILTIN, 'b', 'c', 'e', 'f', 'k223b', 'toi178_c', 'p_outer'),
  fc.stringMatching(/^[a-z][a-z0-9_]{0,7}$/),
).filter((n) => !OPTION_WORDS.includes(n) && !(STATEMENT_KEYWORDS as readonly string[]).includes(n)
  && !Object.hasOwn(FUNCTIONS, n) && suggest(n, OPTION_WORDS) === undefined && !isUnit(n) && unitHint(n) === undefined);

/** A decimal number as a user writes it: `7`, `7.3845`, `1.5e3`. */
export const arbNumberText: fc.Arbitrary<string> = fc.oneof(
  fc.nat(100000).map(String),
  fc.tuple(fc.nat(99999), fc.nat(99999)).map(([a, b]) => `${a}.${b}`),
  fc.tuple(fc.integer({ min: 1, max: 9 }), fc.nat(999), fc.integer({ min: -12, max: 12 })).map(([a, b, e]) => `${a}.${b}e${e}`),
);


function withUnit(units: readonly string[]): fc.Arbitrary<string> {
  return fc.tuple(arbNumberText, fc.constantFrom(...units), fc.option(fc.tuple(fc.constantFrom('±', '+-'), arbNumberText, fc.boolean())))
    .map(([n, u, s]) => {
      const value = `${n} ${u}`;
      if (!s) return value;
      const [pm, sn, withSigmaUnit] = s;
      return `${value} ${pm} ${sn}${withSigmaUnit ? ` ${u}` : ''}`;
    });
}

export const arbPeriod = withUnit(['s', 'min', 'h', 'd', 'yr', 'kyr', '/d', '/yr', 'deg/d']);
export const arbAngle = withUnit(['deg', 'arcmin', 'arcsec', 'rad', '°']);
export const arbStep = withUnit(['h', 'd', 'yr']);

/** An operand of `synodic`, `ratio`, `relation`: a body, a period or a call. */
export const arbOperand: fc.Arbitrary<string> = fc.oneof(
  arbName,
  arbPeriod,
  arbName.map((n) => `period(${n})`),
  fc.tuple(arbName, arbName).map(([a, b]) => `synodic(${a}, ${b})`),
);

/** An expression for `let`, with precedence, parentheses and negation. */
export const arbExpr: fc.Arbitrary<string> = fc.letrec((tie) => ({
  expr: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    arbOperand,
    arbNumberText,
    fc.tuple(tie('expr'), fc.constantFrom('+', '-', '*', '/'), tie('expr')).map(([a, op, b]) => `${a} ${op} ${b}`),
    tie('expr').map((e) => `(${e})`),
    tie('expr').map((e) => `-${e}`),
    arbName.map((n) => `frequency(${n})`),
  ),
})).expr as fc.Arbitrary<string>;

const pad4 = (y: number): string => `${y < 0 ? '-' : ''}${String(Math.abs(y)).padStart(4, '0')}`;
const two = (n: number): string => String(n).padStart(2, '0');

/** A date in every written form the language accepts. */
export const arbDate: fc.Arbitrary<string> = fc.oneof(
  fc.integer({ min: -9999, max: 9999 }).map(pad4),
  fc.integer({ min: 1, max: 3000 }).map(String),
  fc.tuple(fc.integer({ min: -4000, max: 9999 }), fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 28 }))
    .map(([y, m, d]) => `${pad4(y)}-${two(m)}-${two(d)}`),
  fc.tuple(fc.integer({ min: 1000, max: 3000 }), fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 28 }),
    fc.integer({ min: 0, max: 23 }), fc.integer({ min: 0, max: 59 }), fc.constantFrom('T', ' '), fc.constantFrom('', 'Z', ' TT', ' UTC'))
    .map(([y, m, d, h, mi, sep, z]) => `${pad4(y)}-${two(m)}-${two(d)}${sep}${two(h)}:${two(mi)}${sep === ' ' && z === 'Z' ? '' : z}`),
  fc.tuple(fc.integer({ min: 0, max: 5_000_000 }), fc.nat(99), fc.constantFrom('', ' TT', ' UTC')).map(([j, f, s]) => `JD ${j}.${f}${s}`),
);

const arbSpan = fc.tuple(arbDate, arbDate).map(([a, b]) => `from ${a} to ${b}`);

/** Option clauses in a random order. */
function clauses(parts: ReadonlyArray<fc.Arbitrary<string | null>>): fc.Arbitrary<string> {
  return fc.tuple(...parts).chain((xs) => fc.shuffledSubarray(xs.filter((x): x is string => x !== null), { minLength: xs.filter((x) => x !== null).length }))
    .map((xs) => xs.join(' '));
}

const opt = <T>(a: fc.Arbitrary<T>): fc.Arbitrary<T | null> => fc.option(a, { nil: null });

/** One valid statement of any v1 kind, on one line. */
export const arbValidStatement: fc.Arbitrary<string> = fc.oneof(
  arbDate.map((d) => `date ${d}`),
  fc.tuple(arbName, arbExpr).map(([n, e]) => `let ${n} = ${e}`),
  fc.tuple(arbName, arbPeriod, opt(fc.nat(1000).map(String))).map(([n, p, m]) => `body ${n} period ${p}${m !== null ? ` mass ${m}` : ''}`),
  fc.tuple(arbOperand, arbOperand, opt(arbSpan)).map(([a, b, s]) => `synodic ${a} ${b}${s ? ` ${s}` : ''}`),
  fc.tuple(arbOperand, arbOperand, opt(fc.integer({ min: 1, max: 50 }))).map(([a, b, n]) => `ratio ${a} ${b}${n !== null ? ` up-to ${n}` : ''}`),
  fc.tuple(fc.array(arbOperand, { minLength: 2, maxLength: 8 }),
    clauses([opt(fc.integer({ min: 1, max: 6 }).map((k) => `up-to ${k}`)), opt(fc.integer({ min: 1, max: 20 }).map((m) => `top ${m}`))]))
    .map(([ops, c]) => `relation ${ops.join(' ')} ${c}`.trimEnd()),
  fc.tuple(arbName, arbName, clauses([arbSpan, opt(fc.constantFrom('seen-from sun', 'seen-from earth')), opt(arbAngle.map((a) => `within ${a}`))]))
    .map(([a, b, c]) => `conjunctions ${a} ${b} ${c}`),
  fc.tuple(arbName, arbSpan).map(([a, s]) => `oppositions ${a} ${s}`),
  fc.tuple(fc.array(arbName, { minLength: 2, maxLength: 5 }),
    clauses([opt(fc.array(arbName, { minLength: 1, maxLength: 3 }).map((xs) => `against ${xs.join(' ')}`)), arbAngle.map((a) => `within ${a}`), arbSpan,
      opt(fc.constantFrom('seen-from sun', 'seen-from earth'))]))
    .map(([bs, c]) => `alignment ${bs.join(' ')} ${c}`),
  clauses([arbSpan, opt(arbStep.map((s) => `step ${s}`))]).map((c) => `barycentre ${c}`),
  fc.tuple(arbName, fc.stringMatching(/^[a-z0-9_/ .#-]{1,20}$/), arbName, arbName, opt(fc.constantFrom('yr', 'd', 'jd')))
    .chain(([n, path, t, v, u]) => clauses([fc.constant(`from "${path}"`), fc.constant(`time ${t}`), fc.constant(`value ${v}`), fc.constant(u ? `time-unit ${u}` : null)])
      .map((c) => `series ${n} ${c}`)),
  fc.tuple(arbName, clauses([
    opt(fc.tuple(arbPeriod, arbPeriod).map(([a, b]) => `periods ${a} to ${b}`)),
    opt(fc.integer({ min: 1, max: 10 }).map((m) => `peaks ${m}`)),
    opt(fc.array(arbPeriod, { minLength: 1, maxLength: 3 }).map((xs) => `mark ${xs.join(', ')}`)),
  ])).map(([n, c]) => `periodogram ${n} ${c}`.trimEnd()),
  fc.oneof(fc.nat().map((n) => `set seed ${n}`), fc.constantFrom('set calendar gregorian', 'set calendar mixed')),
);

/** A statement text, possibly broken over continuation lines at spaces (never inside a string). */
const laidOutStatement = (indent: string): fc.Arbitrary<string> => fc.tuple(arbValidStatement, fc.array(fc.nat(), { maxLength: 3 }), fc.boolean())
  .map(([s, breaks, trailingComment]) => {
    const quote = s.indexOf('"');
    const lastQuote = s.lastIndexOf('"');
    const spaces = [...s.matchAll(/ /g)].map((m) => m.index).filter((i) => i > s.indexOf(' ') && (quote < 0 || i < quote || i > lastQuote));
    // Break only between clauses of a date-free region: dates may contain spaces (`06:30 TT`).
    const safe = spaces.filter((i) => !/JD$/.test(s.slice(0, i)) && (!/\d$/.test(s.slice(0, i)) || !/^\s*(\d|TT|UTC)/.test(s.slice(i))));
    const at = new Set(breaks.map((b) => safe[b % Math.max(1, safe.length)]).filter((x): x is number => x !== undefined));
    let out = '';
    for (let i = 0; i < s.length; i++) out += at.has(i) ? `\n${indent}    ` : s[i];
    return `${indent}${out}${trailingComment ? '  # note' : ''}`;
  });

/** A valid block: statements at one indentation, with blank and comment lines between them. */
export const arbValidBlock: fc.Arbitrary<{ text: string; statements: number }> = fc.constantFrom('', '  ').chain((indent) => fc.array(
  fc.tuple(laidOutStatement(indent), fc.constantFrom('', '\n', '\n# a comment line', '\n   # indented comment')),
  { minLength: 1, maxLength: 8 },
)).map((xs) => ({ text: xs.map(([s, extra]) => `${s}${extra}`).join('\n'), statements: xs.length }));

/** Characters that stress the lexer: quotes, comment marks, units, unicode, line breaks. */
const nasty = fc.constantFrom('"', '#', '±', '°', '-', '+', '/', '*', '(', ')', ',', '=', '.', ':', 'T', 'Z', '\t', ' ', '\n', '\r', '\r\n',
  'e', '9', '0', 'é', 'ß', '𝛼', '🚀', '\u200b', '\u00a0', '\u2028', '\ud800', 'JD ', ' TT', 'up-to', 'from', ' to ', '1e999', '99999999999999999999999',
  '-0500-03-01', '2031-13-45T25:61Z', '°/d', 'deg/', '/d', 'toString', '__proto__', 'constructor');

type Mutation = (s: string) => fc.Arbitrary<string>;

const mutations: Mutation[] = [
  // delete a slice
  (s) => fc.tuple(fc.nat(s.length), fc.nat(6)).map(([i, n]) => s.slice(0, i) + s.slice(i + n)),
  // insert something nasty
  (s) => fc.tuple(fc.nat(s.length), nasty).map(([i, x]) => s.slice(0, i) + x + s.slice(i)),
  // replace a character
  (s) => fc.tuple(fc.nat(Math.max(0, s.length - 1)), fc.oneof(nasty, fc.string({ unit: 'binary', minLength: 1, maxLength: 2 })))
    .map(([i, x]) => s.slice(0, i) + x + s.slice(i + 1)),
  // shuffle the tokens of the block
  (s) => fc.shuffledSubarray(s.split(/(?<= )/), { minLength: s.split(/(?<= )/).length }).map((xs) => xs.join('')),
  // drop a token
  (s) => { const xs = s.split(' '); return fc.nat(xs.length - 1).map((i) => xs.filter((_, j) => j !== i).join(' ')); },
  // a huge number somewhere
  (s) => fc.tuple(fc.nat(s.length), fc.constantFrom('1e308', '1e309', '123456789012345678901234567890', '0.000000000000000000001', '1e-400'))
    .map(([i, x]) => `${s.slice(0, i)} ${x} ${s.slice(i)}`),
  // re-indent a line
  (s) => { const ls = s.split('\n'); return fc.tuple(fc.nat(ls.length - 1), fc.constantFrom('', ' ', '        ', '\t')).map(([i, ind]) => ls.map((l, j) => (j === i ? ind + l.trimStart() : l)).join('\n')); },
];

/** A valid block with one to four random mutations applied. */
export const arbMutatedBlock: fc.Arbitrary<string> = fc.tuple(arbValidBlock, fc.array(fc.nat(mutations.length - 1), { minLength: 1, maxLength: 4 }))
  .chain(([b, ms]) => ms.reduce<fc.Arbitrary<string>>((acc, m) => acc.chain((s) => mutations[m]!(s)), fc.constant(b.text)));

/** Arbitrary text: any UTF-16 (including lone surrogates), or lines of keyword-ish soup. */
export const arbRandomBlock: fc.Arbitrary<string> = fc.oneof(
  fc.string({ unit: 'binary', maxLength: 200 }),
  fc.string({ unit: 'grapheme', maxLength: 200 }),
  fc.array(fc.oneof(nasty, fc.constantFrom(...STATEMENT_KEYWORDS, ...OPTION_WORDS, 'jupiter', '3', 'd', 'deg')), { maxLength: 40 })
    .map((xs) => xs.join(' ')),
);
