import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import type { Range } from '../../language/ast.js';
import { DEFAULT_LIMITS } from '../../compute/limits.js';
import { createNoteEvaluator, FileAccessError } from '../../compute/note.js';
import { arbMutatedBlock, arbRandomBlock, arbValidBlock } from './arbitraries.js';

/** Small limits keep 10⁴ evaluations quick; hitting a limit is a diagnostic like any other. */
const limits = { ...DEFAULT_LIMITS, maxEvaluations: 3000, maxSpanDays: 40 * 365.25, maxTrials: 300, maxEvents: 200 };

const host = {
  readText: async (path: string): Promise<string> => {
    if (path.includes('..')) throw new FileAccessError(`\`${path}\` lies outside the workspace`, 'outside-workspace');
    if (path.length % 3 === 0) throw new FileAccessError(`file not found: \`${path}\``, 'not-found');
    return 't,v,x\n1,2,a\n2,3.5,b\n3,1e3,c\n4,-2,d\n5,0,e\n6,7,f\n';
  },
};

function assertRangeInNote(r: Range, lines: readonly string[], what: string): void {
  const ok = (p: Range['start']): boolean => Number.isInteger(p.line) && p.line >= 0 && p.line < lines.length
    && Number.isInteger(p.character) && p.character >= 0 && p.character <= lines[p.line]!.length;
  assert.ok(ok(r.start) && ok(r.end), `${what}: ${JSON.stringify(r)} is not inside the note`);
  assert.ok(r.start.line < r.end.line || (r.start.line === r.end.line && r.start.character <= r.end.character), `${what}: start after end`);
}

describe('the note evaluator on random input (property)', function () {
  this.timeout(600000);

  it('never throws, and every diagnostic has a valid range, over 10⁴ generated, mutated and random blocks', async () => {
    const block = fc.oneof(
      { weight: 3, arbitrary: arbValidBlock.map((b) => b.text) },
      { weight: 4, arbitrary: arbMutatedBlock },
      { weight: 2, arbitrary: arbRandomBlock },
    );
    const note = fc.tuple(fc.array(block, { minLength: 1, maxLength: 3 }), fc.constantFrom('\n', '\r\n'), fc.boolean())
      .map(([blocks, eol, indented]) => ['# note', '', ...blocks.flatMap((b) => [indented ? '  ```orbit' : '```orbit', b, indented ? '  ```' : '```', 'prose'])].join(eol));
    let statements = 0;
    let diagnostics = 0;
    await fc.assert(fc.asyncProperty(note, async (text) => {
      const evaluator = createNoteEvaluator({ host, limits });
      const e = await evaluator.evaluate(text);
      const lines = text.split(/\r\n|\r|\n/);
      for (const d of e.diagnostics) assertRangeInNote(d.range, lines, `${d.code} ${d.message}`);
      for (const b of e.blocks) {
        for (const s of b.statements) {
          statements += 1;
          assert.ok(s.result !== undefined || s.diagnostics.length > 0, `statement on line ${s.statement.range.start.line} has neither result nor diagnostic`);
          assert.ok(!s.diagnostics.some((d) => d.code === 'OB405'), `internal error: ${s.diagnostics.map((d) => d.message).join('; ')}`);
        }
      }
      diagnostics += e.diagnostics.length;
    }), { numRuns: 10_000 });
    assert.ok(statements > 10_000 && diagnostics > 1000, `exercised ${statements} statements and ${diagnostics} diagnostics`);
  });
});
