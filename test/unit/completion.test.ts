import { strict as assert } from 'node:assert';
import { STATEMENT_KEYWORDS } from '../../language/ast.js';
import { complete, type CompletionItem, type CompletionKind } from '../../language/completion.js';
import { marked } from './marked.js';

const ctx = { names: ['p_outer', 'spots', 'b'], bodies: ['sun', 'earth', 'mars', 'jupiter', 'saturn', 'b'] };

/** Completions at the `‸` of a fixture placed at document line 12. */
function at(text: string): CompletionItem[] {
  const m = marked(text, 12);
  assert.ok(m.cursor, 'fixture needs a ‸');
  return complete(m.content, 12, m.cursor, ctx);
}

function labels(items: readonly CompletionItem[], kind?: CompletionKind): string[] {
  return items.filter((i) => kind === undefined || i.kind === kind).map((i) => i.label);
}

describe('complete', () => {
  it('offers every statement keyword with its syntax at the start of a line', () => {
    const items = at('date 2030\n‸');
    assert.deepEqual(labels(items), [...STATEMENT_KEYWORDS]);
    assert.ok(items.every((i) => i.kind === 'keyword'));
    assert.equal(items.find((i) => i.label === 'ratio')?.detail, 'ratio A B [up-to N] — period ratio and its convergents');
  });

  it('offers keywords while the first word is being typed', () => {
    assert.deepEqual(labels(at('  conj‸')), [...STATEMENT_KEYWORDS]);
  });

  it('offers bodies, names and functions where an operand goes', () => {
    const items = at('synodic jupiter ‸');
    assert.deepEqual(labels(items, 'body'), ctx.bodies);
    assert.deepEqual(labels(items, 'name'), ['p_outer', 'spots']);
    assert.deepEqual(labels(items, 'keyword'), ['period', 'frequency', 'synodic', 'abs']);
  });

  it('offers the options once a statement has its operands', () => {
    assert.deepEqual(labels(at('synodic jupiter saturn ‸')), ['from']);
    assert.deepEqual(labels(at('ratio 11.86 yr 29.46 yr ± 0.01 yr ‸')), ['up-to']);
    assert.deepEqual(labels(at('conjunctions venus mars ‸')), ['from', 'seen-from', 'within']);
  });

  it('leaves out options already given', () => {
    assert.deepEqual(labels(at('conjunctions venus mars from 2030 to 2040 within 3 deg ‸')), ['seen-from']);
  });

  it('offers units after a number, with their dimension', () => {
    const items = at('let p = 11.86 ‸');
    assert.ok(items.length > 0 && items.every((i) => i.kind === 'unit'));
    assert.ok(labels(items).includes('yr') && labels(items).includes('deg/d'));
    assert.equal(items.find((i) => i.label === 'km')?.detail, 'length');
  });

  it('offers units while a unit attached to the number is being typed', () => {
    assert.ok(labels(at('body b period 7.38y‸')).includes('yr'));
  });

  it('offers units after within, and the rest of the options after the angle', () => {
    assert.ok(labels(at('conjunctions venus mars from 2030 to 2040 within 5 ‸')).includes('deg'));
    assert.deepEqual(labels(at('alignment venus mars within 5 deg ‸')), ['against', 'from', 'seen-from']);
  });

  it('offers `to` inside a span, and nothing where a date goes', () => {
    assert.deepEqual(labels(at('oppositions mars from ‸')), []);
    assert.deepEqual(labels(at('oppositions mars from 2030 ‸')), ['to']);
    assert.deepEqual(labels(at('oppositions mars from 2030 to ‸')), []);
  });

  it('offers the values of seen-from, time-unit, set and set calendar', () => {
    assert.deepEqual(labels(at('conjunctions venus mars seen-from ‸')), ['sun', 'earth']);
    assert.deepEqual(labels(at('series s from "a.csv" time t value v time-unit ‸')), ['yr', 'd', 'jd']);
    assert.deepEqual(labels(at('set ‸')), ['seed', 'calendar']);
    assert.deepEqual(labels(at('set calendar ‸')), ['gregorian', 'mixed']);
  });

  it('offers bodies and options in an operand list once it is long enough', () => {
    assert.deepEqual(labels(at('relation b ‸'), 'option'), []);
    assert.deepEqual(labels(at('relation b mars ‸'), 'option'), ['up-to', 'top']);
    assert.ok(labels(at('relation b mars ‸'), 'body').includes('jupiter'));
  });

  it('counts a call and an expression as one operand each', () => {
    assert.deepEqual(labels(at('synodic period(b) 2 * p_outer ‸')), ['from']);
    assert.deepEqual(labels(at('synodic 3 d +- 0.1 d ‸'), 'option'), []);
  });

  it('offers defined names after periodogram and then its options', () => {
    assert.deepEqual(labels(at('periodogram ‸')), ctx.names);
    assert.deepEqual(labels(at('periodogram spots ‸')), ['periods', 'peaks', 'mark']);
    assert.deepEqual(labels(at('periodogram spots periods 2 yr ‸')), ['to']);
  });

  it('continues a statement on a deeper-indented line', () => {
    assert.deepEqual(labels(at('conjunctions venus mars\n    from 2030 to 2040\n    ‸')), ['seen-from', 'within']);
  });

  it('offers nothing inside a comment or a string, or outside the block', () => {
    assert.deepEqual(at('synodic jupiter # ‸'), []);
    assert.deepEqual(at('series s from "da‸'), []);
    assert.deepEqual(complete('date 2030', 12, { line: 3, character: 0 }, ctx), []);
  });

  it('offers nothing after an unknown statement keyword', () => {
    assert.deepEqual(at('frobnicate ‸'), []);
  });
});
