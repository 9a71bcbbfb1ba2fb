import { strict as assert } from 'node:assert';
import { createNoteEvaluator, FileAccessError, type NoteEvaluation } from '../../compute/note.js';

const fence = (body: string, name = ''): string => `\`\`\`orbit${name ? ` ${name}` : ''}\n${body}\n\`\`\``;

function stmts(e: NoteEvaluation) {
  return e.blocks.flatMap((b) => b.statements);
}
function codes(e: NoteEvaluation): string[] {
  return e.diagnostics.map((d) => d.code);
}

describe('note evaluation', () => {
  it('shares names with later blocks in document order', async () => {
    const note = ['# n', fence('let p = 10 d ± 1 d'), 'text', fence('let q = p * 2')].join('\n');
    const e = await createNoteEvaluator().evaluate(note);
    assert.deepEqual(codes(e), []);
    const q = stmts(e)[1]!.result!.value!;
    assert.equal(q.number, 20);
    assert.equal(q.uncertainty, 2);
  });

  it('reports a name used before its definition at the name, and keeps evaluating the rest', async () => {
    const note = [fence('let q = p * 2\nlet r = 3 d'), fence('let p = 1 d')].join('\n');
    const e = await createNoteEvaluator().evaluate(note);
    const d = e.diagnostics.find((x) => x.code === 'OB201');
    assert.ok(d, JSON.stringify(e.diagnostics));
    assert.deepEqual(d.range.start, { line: 1, character: 8 });
    assert.equal(stmts(e)[1]!.result!.value!.number, 3);
    assert.equal(stmts(e)[2]!.result!.value!.number, 1);
  });

  it('refuses to redefine a name, saying where it was first defined', async () => {
    const e = await createNoteEvaluator().evaluate([fence('let p = 1 d'), fence('let p = 2 d')].join('\n'));
    const d = e.diagnostics.find((x) => x.code === 'OB202');
    assert.ok(d);
    assert.match(d.message, /line 2/);
  });

  it('refuses a user body named like a built-in one', async () => {
    const e = await createNoteEvaluator().evaluate(fence('body mars period 687 d'));
    assert.ok(e.diagnostics.some((x) => x.code === 'OB202' && /built-in/.test(x.message)));
  });

  it('suggests the built-in body a misspelt name was meant to be', async () => {
    const e = await createNoteEvaluator().evaluate(fence('let s = synodic(marz, earth)'));
    const d = e.diagnostics.find((x) => x.code === 'OB201' || x.code === 'OB203');
    assert.ok(d, JSON.stringify(e.diagnostics));
    assert.match(d.message, /did you mean `mars`/);
  });

  it('propagates a shared input as fully correlated: p − p is exact', async () => {
    const e = await createNoteEvaluator().evaluate(fence('let p = 10 d ± 1 d\nlet z = p - p\nlet s = p + p'));
    assert.equal(stmts(e)[1]!.result!.value!.uncertainty, 0);
    assert.equal(stmts(e)[2]!.result!.value!.uncertainty, 2);
  });

  it('marks a statement that uses a failed definition with the failed line', async () => {
    const e = await createNoteEvaluator().evaluate(fence('let p = 10 d + 3 deg\nlet q = p * 2'));
    assert.ok(e.diagnostics.some((d) => d.code === 'OB301'));
    const dep = e.diagnostics.find((d) => d.code === 'OB205');
    assert.ok(dep);
    assert.match(dep.message, /line 2/);
  });

  it('re-evaluates only the statements that depend on a changed definition', async () => {
    const ev = createNoteEvaluator();
    const note = (p: string) => [fence(`let p = ${p} d\nlet unrelated = 5 d`), fence('let q = p * 2\nlet r = unrelated * 3\ndate 2000-01-01')].join('\n');
    const first = await ev.evaluate(note('10'));
    assert.equal(first.evaluated, 5);
    const second = await ev.evaluate(note('11'));
    assert.equal(second.evaluated, 2, 'p and q only');
    assert.equal(second.reused, 3);
    assert.equal(stmts(second)[2]!.result!.value!.number, 22);
    // The block digest of the second block changes because q changed; an unrelated edit does not.
    assert.notEqual(first.blocks[1]!.inputsDigest, second.blocks[1]!.inputsDigest);
  });

  it('moves a cached diagnostic with its statement when lines are inserted above', async () => {
    const ev = createNoteEvaluator();
    const a = await ev.evaluate(fence('let bad = 1 d + 1 deg'));
    const b = await ev.evaluate('\n\n' + fence('let bad = 1 d + 1 deg'));
    assert.equal(b.reused, 1);
    assert.equal(b.diagnostics[0]!.range.start.line, a.diagnostics[0]!.range.start.line + 2);
  });

  it('applies note-wide settings wherever they are written, and rejects a second one', async () => {
    const e = await createNoteEvaluator().evaluate([fence('date 1000-03-01'), fence('set calendar gregorian\nset calendar mixed')].join('\n'));
    assert.equal(e.settings.calendar, 'gregorian');
    assert.ok(e.diagnostics.some((d) => d.code === 'OB202'));
  });

  it('turns a refused data-file read into an error at the path', async () => {
    const ev = createNoteEvaluator({ host: { readText: async () => { throw new FileAccessError('`../x.csv` lies outside the workspace', 'outside-workspace'); } } });
    const e = await ev.evaluate(fence('series s from "../x.csv" time t value v'));
    const d = e.diagnostics.find((x) => x.code === 'OB404' || x.code === 'OB303');
    assert.ok(d, JSON.stringify(e.diagnostics));
  });

  it('gives a user body a period, its mean motion and uncertainty', async () => {
    const e = await createNoteEvaluator().evaluate(fence('body inner period 5.0931 d ± 0.0004 d'));
    const r = stmts(e)[0]!.result!;
    // Mean motion n = 360°/P = 70.684 deg/d, σ_n = n·σ_P/P = 0.0056 deg/d (first order; common practice).
    assert.match(r.summary, /mean motion 70\.6839 ± 0\.0056 deg\/d/);
    assert.equal(r.value!.uncertainty, 0.0004);
  });

  it('computes uncertainties of a ratio of measured periods as the GUM quotient rule says', async () => {
    const e = await createNoteEvaluator().evaluate(fence('let a = 7.6512 d ± 0.0006 d\nlet b = 5.0931 d ± 0.0004 d\nlet r = a / b'));
    const r = stmts(e)[2]!.result!.value!;
    // First-order: σ_r/r = √((σa/a)² + (σb/b)²) (JCGM 100:2008, eq. 12 for a quotient).
    const expected = r.number * Math.hypot(0.0006 / 7.6512, 0.0004 / 5.0931);
    const toleranceRelative = 1e-12;
    const error = Math.abs(r.uncertainty - expected) / expected;
    assert.ok(error < toleranceRelative, `relative error ${error}`);
  });

  it('names the new line of a failed definition after lines are inserted above it', async () => {
    const ev = createNoteEvaluator();
    const body = 'let p = 3 d + 1 deg\nlet q = p * 2';
    await ev.evaluate(fence(body));
    const moved = await ev.evaluate(`# a\n\n${fence(body)}`);
    const dep = moved.diagnostics.find((d) => d.code === 'OB205');
    assert.ok(dep);
    assert.match(dep.message, /line 4/);
  });
});
