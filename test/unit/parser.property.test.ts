import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import type { Position, Range } from '../../language/ast.js';
import { complete } from '../../language/completion.js';
import { Code } from '../../language/diagnostics.js';
import { splitLines } from '../../language/lexer.js';
import { parseBlock } from '../../language/parser.js';
import { arbMutatedBlock, arbRandomBlock, arbValidBlock } from './arbitraries.js';

const before = (a: Position, b: Position): boolean => a.line < b.line || (a.line === b.line && a.character <= b.character);

/** A range that starts before it ends and lies on the block's lines, within each line's length. */
function assertRangeInBlock(r: Range, lines: readonly string[], firstLine: number, what: string): void {
  assert.ok(before(r.start, r.end), `${what}: start after end ${JSON.stringify(r)}`);
  for (const p of [r.start, r.end]) {
    const text = lines[p.line - firstLine];
    assert.ok(text !== undefined, `${what}: line ${p.line} is outside the block (${firstLine}…${firstLine + lines.length - 1})`);
    assert.ok(Number.isInteger(p.character) && p.character >= 0 && p.character <= text.length,
      `${what}: character ${p.character} outside line ${p.line} of length ${text.length}`);
  }
}

/** Every node range inside a statement lies within the statement's range. */
function assertNested(node: unknown, outer: Range, path: string): void {
  if (node === null || typeof node !== 'object') return;
  for (const [k, v] of Object.entries(node)) {
    if ((k === 'range' || k.endsWith('Range')) && v && typeof v === 'object' && 'start' in v) {
      const r = v as Range;
      assert.ok(before(outer.start, r.start) && before(r.end, outer.end), `${path}.${k} ${JSON.stringify(r)} is outside ${JSON.stringify(outer)}`);
    } else if (typeof v === 'object') {
      assertNested(v, outer, `${path}.${k}`);
    }
  }
}

function checkBlock(text: string, firstLine: number): ReturnType<typeof parseBlock> {
  const result = parseBlock(text, firstLine);
  const lines = splitLines(text);
  for (const d of result.diagnostics) {
    assertRangeInBlock(d.range, lines, firstLine, `diagnostic ${d.code} "${d.message}"`);
    assert.notEqual(d.code, Code.Internal, d.message);
    assert.ok(d.message.length > 0);
  }
  for (const s of result.statements) {
    assertRangeInBlock(s.range, lines, firstLine, `statement ${s.kind}`);
    assertNested(s, s.range, s.kind);
  }
  for (const f of result.failed) assertRangeInBlock(f.range, lines, firstLine, 'failed statement');
  return result;
}

const firstLine = fc.nat(10_000);

describe('parseBlock and complete on generated blocks', () => {
  it('parses every generated valid block into one statement per generated statement with no diagnostic', () => {
    fc.assert(fc.property(arbValidBlock, firstLine, (block, line) => {
      const result = checkBlock(block.text, line);
      assert.deepEqual(result.diagnostics, [], block.text);
      assert.equal(result.statements.length, block.statements, block.text);
    }), { numRuns: 2000 });
  });

  it('never throws on 6000 mutated blocks, and every range it reports is valid', () => {
    fc.assert(fc.property(arbMutatedBlock, firstLine, (text, line) => { checkBlock(text, line); }), { numRuns: 6000 });
  });

  it('never throws on 3000 random texts, and every range it reports is valid', () => {
    fc.assert(fc.property(arbRandomBlock, firstLine, (text, line) => { checkBlock(text, line); }), { numRuns: 3000 });
  });

  it('reports an error for every line that a mutation turned into a failed statement', () => {
    // A failed statement always comes with at least one error diagnostic inside its lines.
    fc.assert(fc.property(arbMutatedBlock, (text) => {
      const result = parseBlock(text, 0);
      for (const f of result.failed) {
        assert.ok(result.diagnostics.some((d) => d.severity === 'error' && d.range.start.line >= f.range.start.line && d.range.end.line <= f.range.end.line),
          `no diagnostic for the failed statement at ${JSON.stringify(f.range)} in ${JSON.stringify(text)}`);
      }
    }), { numRuns: 1000 });
  });

  it('completes at any position of 1000 mutated blocks without throwing, offering only labelled items', () => {
    fc.assert(fc.property(arbMutatedBlock, fc.nat(), fc.nat(), (text, l, c) => {
      const lines = splitLines(text);
      const line = l % lines.length;
      const character = c % (lines[line]!.length + 1);
      const items = complete(text, 0, { line, character }, { names: ['p'], bodies: ['mars'] });
      for (const i of items) assert.ok(i.label.length > 0, JSON.stringify(i));
    }), { numRuns: 1000 });
  });
});
