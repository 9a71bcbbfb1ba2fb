import { strict as assert } from 'node:assert';
import type { DateLit, Expr, Range, Statement } from '../../language/ast.js';
import { Code, type Diagnostic } from '../../language/diagnostics.js';
import { parseBlock } from '../../language/parser.js';
import { marked } from './marked.js';

/** Parse a marked fixture placed at document line `line`. */
function parse(text: string, line = 20, knownNames?: ReadonlySet<string>) {
  const m = marked(text, line);
  const result = parseBlock(m.content, line, knownNames ? { knownNames } : {});
  return { ...result, ranges: m.ranges };
}

function only<T>(xs: readonly T[]): T {
  assert.equal(xs.length, 1, `expected exactly one, got ${JSON.stringify(xs, null, 1)}`);
  return xs[0]!;
}

function codes(ds: readonly Diagnostic[]): Code[] { return ds.map((d) => d.code); }

function stmt<K extends Statement['kind']>(s: Statement | undefined, kind: K): Extract<Statement, { kind: K }> {
  assert.ok(s, 'expected a statement');
  assert.equal(s.kind, kind);
  return s as Extract<Statement, { kind: K }>;
}

/** Expression as a compact string, to assert shapes without ranges. */
function show(e: Expr): string {
  switch (e.type) {
    case 'number': return `${e.value}${e.unit ? ` ${e.unit}` : ''}${e.sigma !== undefined ? ` ±${e.sigma}${e.sigmaUnit ? ` ${e.sigmaUnit}` : ''}` : ''}`;
    case 'name': return e.name;
    case 'call': return `${e.fn.name}(${e.args.map(show).join(', ')})`;
    case 'binary': return `(${show(e.left)} ${e.op} ${show(e.right)})`;
    case 'neg': return `-${show(e.operand)}`;
  }
}

function calendar(d: DateLit): Omit<Extract<DateLit, { form: 'calendar' }>, 'range' | 'form'> {
  assert.equal(d.form, 'calendar');
  const { year, month, day, hour, minute, second, scale, text } = d as Extract<DateLit, { form: 'calendar' }>;
  return { year, month, day, hour, minute, second, scale, text };
}

function range(l1: number, c1: number, l2: number, c2: number): Range {
  return { start: { line: l1, character: c1 }, end: { line: l2, character: c2 } };
}

describe('parseBlock', () => {
  describe('statements and lines', () => {
    it('parses one statement of every v1 kind, in order', () => {
      const { statements, diagnostics } = parse([
        'date 2031-03-14',
        'let p = 11.86 yr',
        'body b period 7.3845 d ± 0.0002 d',
        'synodic jupiter saturn',
        'ratio 11.86 yr 29.46 yr',
        'relation b c d',
        'conjunctions venus mars from 2030 to 2040',
        'oppositions mars from 2030 to 2040',
        'alignment venus mars within 10 deg from 2030 to 2040',
        'barycentre from 1900 to 2100',
        'series spots from "spots.csv" time year value count',
        'periodogram spots',
        'set seed 7',
      ].join('\n'));
      assert.deepEqual(diagnostics, []);
      assert.deepEqual(statements.map((s) => s.kind), [
        'date', 'let', 'body', 'synodic', 'ratio', 'relation', 'conjunctions', 'oppositions', 'alignment',
        'barycentre', 'series', 'periodogram', 'set',
      ]);
    });

    it('gives each statement the range from its keyword to its last token, in document lines', () => {
      const { statements, ranges } = parse('# header comment\n\n  ⟦ratio jupiter saturn⟧   # trailing comment\n⟦date 1850⟧', 40);
      assert.deepEqual(statements.map((s) => s.range), ranges);
    });

    it('continues a statement on a line indented deeper, across a comment line and a blank line', () => {
      const { statements, diagnostics, ranges } = parse([
        '⟦relation b c',
        '  # the outer pair',
        '',
        '   d e up-to 3⟧',
        'date 2030',
      ].join('\n'), 5);
      assert.deepEqual(diagnostics, []);
      const rel = stmt(statements[0], 'relation');
      assert.deepEqual(rel.bodies.map(show), ['b', 'c', 'd', 'e']);
      assert.equal(rel.upTo, 3);
      assert.deepEqual(rel.range, ranges[0]);
      assert.deepEqual(rel.bodies[2]!.range, range(8, 3, 8, 4));
      stmt(statements[1], 'date');
    });

    it('starts a new statement on a line indented as deep as the one above', () => {
      const { statements } = parse('  date 2030\n  date 2031');
      assert.equal(statements.length, 2);
    });

    it('reads CRLF and CR line breaks as the editor does', () => {
      const { statements } = parseBlock('date 2030\r\nratio a b\rdate 2031\r\n', 3);
      assert.deepEqual(statements.map((s) => [s.kind, s.range.start.line]), [['date', 3], ['ratio', 4], ['date', 5]]);
    });

    it('reports an error in one statement and still parses the statements before and after it', () => {
      const { statements, diagnostics, ranges } = parse('date 2030\nratio ⟦11.86⟧ 29.46 yr\ndate 2031');
      assert.deepEqual(statements.map((s) => s.kind), ['date', 'date']);
      const d = only(diagnostics);
      assert.equal(d.code, Code.MissingUnit);
      assert.deepEqual(d.range, ranges[0]);
    });

    it('lists failed statements with the name they would have defined', () => {
      const { failed } = parse('let p = 11.86 yearz\nbody b period 7\nseries s from data.csv\nratio a');
      assert.deepEqual(failed.map((f) => [f.kind, f.definedName]), [['let', 'p'], ['body', 'b'], ['series', 's'], ['ratio', undefined]]);
      assert.deepEqual(failed[0]!.range, range(20, 0, 20, 19));
    });
  });

  describe('unknown statements and options', () => {
    it('suggests the closest keyword for an unknown statement, with the range of the word', () => {
      const { diagnostics, ranges } = parse('⟦barycenter⟧ from 1900 to 2000');
      const d = only(diagnostics);
      assert.equal(d.code, Code.UnknownStatement);
      assert.deepEqual(d.range, ranges[0]);
      assert.match(d.message, /unknown statement `barycenter` — did you mean `barycentre`\?/);
    });

    it('lists the statements when a line starts with something that is no keyword', () => {
      const d = only(parse('⟦42⟧ d').diagnostics);
      assert.equal(d.code, Code.UnknownStatement);
      assert.match(d.message, /date, let, body, synodic, ratio, relation, conjunctions, oppositions, alignment, barycentre, series, periodogram, set/);
    });

    it('names the valid options when an option word is unknown', () => {
      const { diagnostics, ranges } = parse('conjunctions venus mars from 2030 to 2040 ⟦whithin⟧ 5 deg');
      const d = only(diagnostics);
      assert.equal(d.code, Code.BadOption);
      assert.deepEqual(d.range, ranges[0]);
      assert.equal(d.message, 'unknown option `whithin` for `conjunctions` — did you mean `within`? Options of `conjunctions`: from, seen-from, within');
    });

    it('reports every unknown option of a statement, not only the first', () => {
      const { diagnostics, ranges } = parse('conjunctions venus mars from 2030 to 2040 ⟦whithin⟧ 5 deg ⟦seen-form⟧ earth');
      assert.deepEqual(diagnostics.map((d) => [d.code, d.range]), [[Code.BadOption, ranges[0]], [Code.BadOption, ranges[1]]]);
      assert.match(diagnostics[1]!.message, /did you mean `seen-from`\?/);
    });

    it('reports a mistyped required option once, not also as missing', () => {
      const { diagnostics, ranges } = parse('oppositions mars ⟦frm⟧ 2030 to 2040');
      assert.deepEqual(diagnostics.map((d) => [d.code, d.range]), [[Code.BadOption, ranges[0]]]);
    });

    it('says what the statement takes when a word is an extra operand', () => {
      const d = only(parse('synodic a b c').diagnostics);
      assert.equal(d.code, Code.BadOption);
      assert.equal(d.message, 'unknown option `c` for `synodic` (`synodic` takes two bodies or periods, then options). Options of `synodic`: from');
    });

    it('takes a word close to an option and followed by a number for a mistyped option in an operand list', () => {
      const { diagnostics, ranges } = parse('relation b c d ⟦tp⟧ 3');
      const d = only(diagnostics);
      assert.equal(d.code, Code.BadOption);
      assert.deepEqual(d.range, ranges[0]);
      assert.match(d.message, /did you mean `top`\?/);
    });

    it('takes that word for a body when the caller says it is a known name', () => {
      const { statements, diagnostics } = parse('relation b c d tp 3 d', 20, new Set(['b', 'c', 'd', 'tp']));
      assert.deepEqual(diagnostics, []);
      assert.deepEqual(stmt(statements[0], 'relation').bodies.map(show), ['b', 'c', 'd', 'tp', '3 d']);
    });

    it('rejects an option given twice at its second occurrence', () => {
      const { diagnostics, ranges } = parse('ratio a b up-to 5 ⟦up-to⟧ 6');
      const d = only(diagnostics);
      assert.equal(d.code, Code.BadOption);
      assert.deepEqual(d.range, ranges[0]);
    });

    it('reports a missing required span on the statement keyword', () => {
      const { diagnostics, ranges } = parse('⟦conjunctions⟧ venus mars within 5 deg');
      const d = only(diagnostics);
      assert.equal(d.code, Code.MissingArgument);
      assert.deepEqual(d.range, ranges[0]);
      assert.match(d.message, /needs a span: add `from 2030 to 2040`/);
    });

    it('reports a value missing at the end of a statement on the last token read', () => {
      const d = only(parse('ratio a b ⟦up-to⟧').diagnostics);
      assert.equal(d.code, Code.MissingArgument);
      assert.deepEqual(d.range, parse('ratio a b ⟦up-to⟧').ranges[0]);
    });

    it('rejects text after the end of a statement that takes no options', () => {
      const { diagnostics, ranges } = parse('date 2030 ⟦extra⟧');
      assert.deepEqual(codes(diagnostics), [Code.UnexpectedToken]);
      assert.deepEqual(diagnostics[0]!.range, ranges[0]);
    });
  });

  describe('numbers, units and uncertainties', () => {
    it('asks for a unit with a hint that repeats the number, never guessing one', () => {
      const { diagnostics, ranges, statements } = parse('body b period ⟦7.3845⟧');
      assert.deepEqual(statements, []);
      const d = only(diagnostics);
      assert.equal(d.code, Code.MissingUnit);
      assert.deepEqual(d.range, ranges[0]);
      assert.equal(d.message, 'the period needs a unit: write `7.3845 d` or `7.3845 yr`');
    });

    it('hints at the unit of the uncertainty when only the uncertainty has one', () => {
      const d = only(parse('ratio 7.3845 ± 0.0002 d 11 d').diagnostics);
      assert.equal(d.code, Code.MissingUnit);
      assert.match(d.message, /write `7\.3845 d`/);
    });

    it('asks for an angle unit after within', () => {
      const d = only(parse('conjunctions venus mars from 2030 to 2040 within ⟦5⟧').diagnostics);
      assert.equal(d.code, Code.MissingUnit);
      assert.match(d.message, /write `5 deg`/);
    });

    it('accepts a plain number in let, where a unit is not required', () => {
      const { statements, diagnostics } = parse('let k = 3');
      assert.deepEqual(diagnostics, []);
      assert.equal(show(stmt(statements[0], 'let').expr), '3');
    });

    it('reports an unknown unit with the closest spelling and the range of the unit', () => {
      const { diagnostics, ranges } = parse('let p = 11.86 ⟦years⟧');
      const d = only(diagnostics);
      assert.equal(d.code, Code.UnknownUnit);
      assert.deepEqual(d.range, ranges[0]);
      assert.match(d.message, /^unknown unit `years` — did you mean `yr`\? Units: s, min, h, d, yr/);
    });

    it('does not take an inherited object key for a unit', () => {
      assert.deepEqual(codes(parse('let p = 11 toString').diagnostics), [Code.UnknownUnit]);
      assert.deepEqual(codes(parse('let p = 11 constructor').diagnostics), [Code.UnknownUnit]);
    });

    it('reads every unit spelling of the language, attached or spaced', () => {
      const { statements, diagnostics } = parse([
        'let a = 1 s', 'let b = 2 min', 'let c = 3 h', 'let d1 = 4 d', 'let e = 5 yr', 'let f = 6 kyr',
        'let g = 7 deg', 'let h1 = 8°', 'let i = 9 arcmin', 'let j = 10 arcsec', 'let k = 11 rad',
        'let l = 12 /d', 'let m = 13/yr', 'let n = 14 deg/d', 'let o = 15 km', 'let q = 16 au', 'let r = 17 rsun',
        'let s1 = 11.86yr', 'let t = 1.5e3 d', 'let u = .5 d',
      ].join('\n'));
      assert.deepEqual(diagnostics, []);
      assert.deepEqual(statements.map((s) => show(stmt(s, 'let').expr)), [
        '1 s', '2 min', '3 h', '4 d', '5 yr', '6 kyr', '7 deg', '8 °', '9 arcmin', '10 arcsec', '11 rad',
        '12 /d', '13 /yr', '14 deg/d', '15 km', '16 au', '17 rsun', '11.86 yr', '1500 d', '0.5 d',
      ]);
    });

    it('keeps the unit range of a composite unit', () => {
      const { statements, ranges } = parse('let w = ⟦0.9856 ⟦deg/d⟧⟧');
      const e = stmt(statements[0], 'let').expr;
      assert.equal(e.type, 'number');
      assert.deepEqual(e.range, ranges[0]);
      assert.deepEqual(e.type === 'number' ? e.unitRange : undefined, ranges[1]);
    });

    it('reads an uncertainty written with ± or +-, with or without its own unit', () => {
      const { statements, diagnostics } = parse('let a = 7.3845 d ± 0.0002 d\nlet b = 7.3845 d +- 0.0002\nlet c = 10.2 yr±0.1 yr');
      assert.deepEqual(diagnostics, []);
      assert.deepEqual(statements.map((s) => show(stmt(s, 'let').expr)), ['7.3845 d ±0.0002 d', '7.3845 d ±0.0002', '10.2 yr ±0.1 yr']);
    });

    it('gives a number with uncertainty the range of the whole literal', () => {
      const { statements, ranges } = parse('body b period ⟦7.3845 d ± 0.0002 d⟧ mass 2');
      const body = stmt(statements[0], 'body');
      assert.deepEqual(body.period.range, ranges[0]);
      assert.equal(show(body.mass!), '2');
    });

    it('rejects a number too large to represent', () => {
      const { diagnostics, ranges } = parse('let x = ⟦1e999⟧ d');
      assert.deepEqual(codes(diagnostics), [Code.BadNumber]);
      assert.deepEqual(diagnostics[0]!.range, ranges[0]);
    });

    it('requires the uncertainty after ±', () => {
      assert.deepEqual(codes(parse('let x = 3 d ±').diagnostics), [Code.MissingArgument]);
    });
  });

  describe('expressions', () => {
    it('binds * and / tighter than + and -, left to right', () => {
      const { statements } = parse('let q = 2 * a + b / c - d / e / f');
      assert.equal(show(stmt(statements[0], 'let').expr), '(((2 * a) + (b / c)) - ((d / e) / f))');
    });

    it('reads calls, parentheses and negation', () => {
      const { statements, diagnostics } = parse('let q = -(synodic(jupiter, saturn) - period(b)) * frequency(c) + abs(x)');
      assert.deepEqual(diagnostics, []);
      assert.equal(show(stmt(statements[0], 'let').expr), '((-(synodic(jupiter, saturn) - period(b)) * frequency(c)) + abs(x))');
    });

    it('gives a binary expression the range of both operands and a call the range up to its parenthesis', () => {
      const { statements, ranges } = parse('let q = ⟦⟦period(b)⟧ * 2⟧');
      const e = stmt(statements[0], 'let').expr;
      assert.equal(e.type, 'binary');
      assert.deepEqual(e.range, ranges[0]);
      assert.deepEqual(e.type === 'binary' ? e.left.range : undefined, ranges[1]);
    });

    it('suggests the closest function for an unknown one', () => {
      const { diagnostics, ranges } = parse('let q = ⟦perod⟧(b)');
      const d = only(diagnostics);
      assert.equal(d.code, Code.UnknownName);
      assert.match(d.message, /did you mean `period`\?/);
      assert.deepEqual(d.range, ranges[0]);
    });

    it('checks the number of arguments of a call', () => {
      const { diagnostics, ranges } = parse('let q = ⟦synodic(a)⟧');
      assert.deepEqual(codes(diagnostics), [Code.MissingArgument]);
      assert.deepEqual(diagnostics[0]!.range, ranges[0]);
      assert.deepEqual(codes(parse('let q = period(a, b)').diagnostics), [Code.UnexpectedToken]);
    });

    it('reports an unclosed parenthesis', () => {
      assert.deepEqual(codes(parse('let q = (a + b').diagnostics), [Code.MissingArgument]);
    });

    it('rejects a name that is clearly not an identifier, with its range', () => {
      const { diagnostics, ranges } = parse('let ⟦3x⟧ = 5');
      const d = only(diagnostics);
      assert.equal(d.code, Code.UnexpectedToken);
      assert.deepEqual(d.range, ranges[0]);
      assert.match(d.message, /names start with a letter/);
    });

    it('accepts names in other scripts', () => {
      const { statements, diagnostics } = parse('let período = 3 d');
      assert.deepEqual(diagnostics, []);
      assert.equal(stmt(statements[0], 'let').name.name, 'período');
    });

    it('requires = after the name in let', () => {
      const { diagnostics, ranges } = parse('let p ⟦11.86⟧ yr');
      assert.deepEqual(codes(diagnostics), [Code.UnexpectedToken]);
      assert.deepEqual(diagnostics[0]!.range, ranges[0]);
    });

    it('reads two period operands without an operator between them as two operands', () => {
      const { statements } = parse('synodic 11.86 yr 29.46 yr');
      const s = stmt(statements[0], 'synodic');
      assert.deepEqual([show(s.a), show(s.b)], ['11.86 yr', '29.46 yr']);
    });

    it('reads period(b) as a call in an operand list, though `period` is also an option word', () => {
      const { statements, diagnostics } = parse('synodic a period(b)');
      assert.deepEqual(diagnostics, []);
      assert.equal(show(stmt(statements[0], 'synodic').b), 'period(b)');
    });

    it('starts the next operand at a minus sign written with a space before and none after', () => {
      const { statements } = parse('synodic a -b\nsynodic a - b c');
      const s1 = stmt(statements[0], 'synodic');
      const s2 = stmt(statements[1], 'synodic');
      assert.deepEqual([show(s1.a), show(s1.b)], ['a', '-b']);
      assert.deepEqual([show(s2.a), show(s2.b)], ['(a - b)', 'c']);
    });
  });

  describe('dates', () => {
    const cases: Array<[string, ReturnType<typeof calendar>]> = [
      ['2031-03-14', { year: 2031, month: 3, day: 14, hour: 0, minute: 0, second: 0, scale: 'UTC', text: '2031-03-14' }],
      ['2031-03-14T06:30Z', { year: 2031, month: 3, day: 14, hour: 6, minute: 30, second: 0, scale: 'UTC', text: '2031-03-14T06:30Z' }],
      ['2031-03-14 06:30 TT', { year: 2031, month: 3, day: 14, hour: 6, minute: 30, second: 0, scale: 'TT', text: '2031-03-14 06:30 TT' }],
      ['2031-03-14T06:30:15.5', { year: 2031, month: 3, day: 14, hour: 6, minute: 30, second: 15.5, scale: 'UTC', text: '2031-03-14T06:30:15.5' }],
      ['0000', { year: 0, month: 1, day: 1, hour: 0, minute: 0, second: 0, scale: 'UTC', text: '0000' }],
      ['-0500-03-01', { year: -500, month: 3, day: 1, hour: 0, minute: 0, second: 0, scale: 'UTC', text: '-0500-03-01' }],
      ['1850', { year: 1850, month: 1, day: 1, hour: 0, minute: 0, second: 0, scale: 'UTC', text: '1850' }],
      ['2031-03 UTC', { year: 2031, month: 3, day: 1, hour: 0, minute: 0, second: 0, scale: 'UTC', text: '2031-03 UTC' }],
    ];
    for (const [text, expected] of cases) {
      it(`reads the date \`${text}\` into its parts`, () => {
        const { statements, diagnostics } = parse(`date ${text}`);
        assert.deepEqual(diagnostics, []);
        const s = stmt(statements[0], 'date');
        assert.deepEqual(calendar(s.date), expected);
        assert.deepEqual(s.date.range, range(20, 5, 20, 5 + text.length));
      });
    }

    it('reads a Julian Date, in UTC unless marked TT', () => {
      const { statements } = parse('date JD 2451545.0\ndate JD 2451545.25 TT');
      const [a, b] = statements.map((s) => stmt(s, 'date').date);
      assert.deepEqual(a, { form: 'jd', jd: 2451545, scale: 'UTC', text: 'JD 2451545.0', range: range(20, 5, 20, 17) });
      assert.deepEqual(b && b.form === 'jd' ? [b.jd, b.scale] : undefined, [2451545.25, 'TT']);
    });

    it('reads a span of two dates in a search', () => {
      const { statements } = parse('oppositions mars from 2031-03-14 06:30 TT to JD 2470000.5');
      const s = stmt(statements[0], 'oppositions');
      assert.equal(s.span.from.text, '2031-03-14 06:30 TT');
      assert.equal(s.span.to.text, 'JD 2470000.5');
    });

    it('reports a month out of range on the month digits', () => {
      const { diagnostics, ranges } = parse('date 2031-⟦13⟧-01');
      const d = only(diagnostics);
      assert.equal(d.code, Code.BadDate);
      assert.deepEqual(d.range, ranges[0]);
      assert.equal(d.message, 'the month must be 1…12; found `13`');
    });

    it('reports a minute out of range', () => {
      const { diagnostics, ranges } = parse('date 2031-01-01 10:⟦61⟧');
      assert.deepEqual(diagnostics.map((d) => [d.code, d.range]), [[Code.BadDate, ranges[0]]]);
    });

    it('rejects Z together with TT', () => {
      assert.deepEqual(codes(parse('date 2031-01-01T10:00Z TT').diagnostics), [Code.BadDate]);
    });

    it('rejects a decimal year and trailing letters as no date, with the range of the whole word', () => {
      const a = parse('date ⟦1850.5⟧');
      assert.deepEqual(a.diagnostics.map((d) => [d.code, d.range]), [[Code.BadDate, a.ranges[0]]]);
      const b = parse('date ⟦2031-03-14x⟧');
      assert.deepEqual(b.diagnostics.map((d) => [d.code, d.range]), [[Code.BadDate, b.ranges[0]]]);
    });

    it('says what a date looks like when a word stands where a date should', () => {
      const { diagnostics, ranges } = parse('barycentre from ⟦tomorrow⟧ to 2030');
      const d = only(diagnostics);
      assert.equal(d.code, Code.BadDate);
      assert.deepEqual(d.range, ranges[0]);
      assert.match(d.message, /`2031-03-14`, `2031-03-14T06:30Z`, `JD 2451545.0` or a year such as `1850`/);
    });

    it('requires `to` in a span', () => {
      const { diagnostics, ranges } = parse('barycentre from 1900 ⟦till⟧ 2000');
      assert.deepEqual(diagnostics.map((d) => [d.code, d.range]), [[Code.MissingArgument, ranges[0]]]);
    });
  });

  describe('statement details', () => {
    it('reads synodic with an optional span', () => {
      const s = stmt(parse('synodic jupiter saturn from 1900 to 2100').statements[0], 'synodic');
      assert.deepEqual([s.span?.from.text, s.span?.to.text], ['1900', '2100']);
      assert.equal(stmt(parse('synodic jupiter saturn').statements[0], 'synodic').span, undefined);
    });

    it('needs two operands for synodic and ratio', () => {
      const { diagnostics, ranges } = parse('⟦ratio jupiter⟧ up-to 5');
      assert.deepEqual(diagnostics.map((d) => [d.code, d.range]), [[Code.MissingArgument, ranges[0]]]);
    });

    it('reads ratio and relation limits as whole numbers', () => {
      assert.equal(stmt(parse('ratio a b up-to 20').statements[0], 'ratio').upTo, 20);
      const r = stmt(parse('relation a b c top 3 up-to 2').statements[0], 'relation');
      assert.deepEqual([r.upTo, r.top], [2, 3]);
      const { diagnostics, ranges } = parse('ratio a b up-to ⟦2.5⟧');
      assert.deepEqual(diagnostics.map((d) => [d.code, d.range]), [[Code.BadNumber, ranges[0]]]);
      assert.deepEqual(codes(parse('relation a b top 0').diagnostics), [Code.BadNumber]);
    });

    it('needs at least two operands for relation', () => {
      assert.deepEqual(codes(parse('relation b up-to 3').diagnostics), [Code.MissingArgument]);
    });

    it('reads conjunctions seen from the Sun by default and from the Earth on request', () => {
      const a = stmt(parse('conjunctions venus mars from 2030 to 2040').statements[0], 'conjunctions');
      assert.equal(a.seenFrom, 'sun');
      assert.equal(a.within, undefined);
      const b = stmt(parse('conjunctions venus mars from 2030 to 2040 seen-from earth within 2 deg').statements[0], 'conjunctions');
      assert.equal(b.seenFrom, 'earth');
      assert.equal(show(b.within!), '2 deg');
      assert.deepEqual([a.a.name, a.b.name], ['venus', 'mars']);
    });

    it('lists the values of seen-from when another is given', () => {
      const { diagnostics, ranges } = parse('conjunctions venus mars from 2030 to 2040 seen-from ⟦moon⟧');
      const d = only(diagnostics);
      assert.equal(d.code, Code.BadOption);
      assert.deepEqual(d.range, ranges[0]);
      assert.match(d.message, /`seen-from` takes `sun` or `earth`/);
    });

    it('wants body names, not numbers, in conjunctions', () => {
      const { diagnostics, ranges } = parse('conjunctions ⟦3⟧ mars from 2030 to 2040');
      assert.deepEqual(diagnostics.map((d) => [d.code, d.range]), [[Code.UnexpectedToken, ranges[0]]]);
    });

    it('reads alignment bodies, the opposite side, the angle, the span and the point of view in any order', () => {
      const s = stmt(parse('alignment venus mars jupiter against neptune uranus from 2030 to 2040 within 10 deg seen-from earth').statements[0], 'alignment');
      assert.deepEqual(s.bodies.map((b) => b.name), ['venus', 'mars', 'jupiter']);
      assert.deepEqual(s.against.map((b) => b.name), ['neptune', 'uranus']);
      assert.equal(show(s.within), '10 deg');
      assert.equal(s.seenFrom, 'earth');
    });

    it('needs an angle and at least two bodies in alignment', () => {
      assert.deepEqual(codes(parse('alignment venus mars from 2030 to 2040').diagnostics), [Code.MissingArgument]);
      assert.deepEqual(codes(parse('alignment venus within 5 deg from 2030 to 2040').diagnostics), [Code.MissingArgument]);
    });

    it('reads barycentre with a step', () => {
      const s = stmt(parse('barycentre from 1900 to 2100 step 10 d').statements[0], 'barycentre');
      assert.equal(show(s.step!), '10 d');
    });

    it('reads series with the path range inside the quotes and days as the default time unit', () => {
      const { statements, ranges, diagnostics } = parse('series spots from "⟦data/spots 1.csv⟧" time "year" value 2');
      assert.deepEqual(diagnostics, []);
      const s = stmt(statements[0], 'series');
      assert.deepEqual([s.path, s.timeColumn, s.valueColumn, s.timeUnit], ['data/spots 1.csv', 'year', '2', 'd']);
      assert.deepEqual(s.pathRange, ranges[0]);
      assert.equal(stmt(parse('series s from "a.csv" time t value v time-unit jd').statements[0], 'series').timeUnit, 'jd');
    });

    it('asks for quotes around a series path and reports an unclosed one', () => {
      const a = parse('series s from ⟦data⟧/x.csv time t value v');
      assert.deepEqual(a.diagnostics.map((d) => [d.code, d.range]), [[Code.UnexpectedToken, a.ranges[0]]]);
      const b = parse('series s from ⟦"data/x.csv time t value v⟧');
      assert.deepEqual(b.diagnostics.map((d) => [d.code, d.range]), [[Code.UnclosedString, b.ranges[0]]]);
    });

    it('keeps a # inside a quoted path', () => {
      const s = stmt(parse('series s from "notes#1.csv" time t value v # comment').statements[0], 'series');
      assert.equal(s.path, 'notes#1.csv');
    });

    it('reads periodogram ranges, peaks and marks', () => {
      const { statements, diagnostics } = parse('periodogram spots periods 2 yr to 30 yr peaks 3 mark 11.86 yr, synodic(jupiter, saturn)');
      assert.deepEqual(diagnostics, []);
      const s = stmt(statements[0], 'periodogram');
      assert.deepEqual(s.periods && [show(s.periods.from), show(s.periods.to)], ['2 yr', '30 yr']);
      assert.equal(s.peaks, 3);
      assert.deepEqual(s.mark?.map(show), ['11.86 yr', 'synodic(jupiter, saturn)']);
    });

    it('reads set seed and set calendar with the range of the value', () => {
      const { statements, ranges } = parse('set seed ⟦42⟧\nset calendar ⟦gregorian⟧\nset calendar mixed');
      const [a, b, c] = statements.map((s) => stmt(s, 'set'));
      assert.deepEqual([a?.key, a?.value, a?.valueRange], ['seed', '42', ranges[0]]);
      assert.deepEqual([b?.key, b?.value, b?.valueRange], ['calendar', 'gregorian', ranges[1]]);
      assert.equal(c?.value, 'mixed');
    });

    it('suggests the setting and its values', () => {
      assert.match(only(parse('set sed 4').diagnostics).message, /did you mean `seed`\?/);
      const d = only(parse('set calendar julain').diagnostics);
      assert.equal(d.code, Code.BadOption);
      assert.match(d.message, /`calendar` takes `gregorian` or `mixed`/);
    });
  });

  describe('positions', () => {
    it('counts characters in UTF-16 units, keeping a character outside the BMP whole', () => {
      const { diagnostics, ranges } = parse('let x = ⟦🚀⟧');
      const d = only(diagnostics);
      assert.equal(d.code, Code.UnexpectedToken);
      assert.deepEqual(d.range, ranges[0]);
      assert.equal(d.range.end.character - d.range.start.character, 2);
    });

    it('reports on the continuation line where the error is', () => {
      const { diagnostics, ranges } = parse('conjunctions venus mars\n    from 2030 to 2040\n    within ⟦5⟧');
      assert.deepEqual(diagnostics.map((d) => [d.code, d.range]), [[Code.MissingUnit, ranges[0]]]);
    });
  });
});
