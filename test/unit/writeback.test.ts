import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { createNoteEvaluator } from '../../compute/note.js';
import { planWrite, regionStatuses } from '../../compute/writeback.js';
import { extractBlocks } from '../../language/extract.js';

const evaluate = (text: string) => createNoteEvaluator().evaluate(text);

async function write(text: string, force = false): Promise<string> {
  return planWrite(text, await evaluate(text), { force }).text;
}

/** The note with every generated region (and the blank line joining it) removed. */
function stripRegions(text: string): string {
  // A region takes its own line break; one written at the very end of a note without a
  // final line break instead takes the break before it.
  return text.replace(/(\r?\n)?<!-- orbit results · [^\n]*\n[\s\S]*?<!-- orbit results end -->(\r?\n|$)/g,
    (_m, lead: string | undefined, trail: string) => (trail === '' ? '' : lead ?? ''));
}

const NOTE = [
  '# A note', '', 'Some text with `code` and a table:', '', '| a | b |', '|---|---|', '| 1 | 2 |', '',
  '```orbit first', 'let p = 10 d ± 1 d', 'date 2000-01-01T12:00Z', '```', '',
  'Between blocks.', '',
  '```orbit', 'let q = p * 3', '```',
  'Last line without newline',
].join('\n');

describe('writing results back', () => {
  it('inserts one region under each block and changes nothing else', async () => {
    const out = await write(NOTE);
    assert.equal((out.match(/<!-- orbit results end -->/g) ?? []).length, 2);
    assert.equal(stripRegions(out), NOTE);
  });

  it('is idempotent, and check finds every region current afterwards', async () => {
    const once = await write(NOTE);
    const twice = await write(once);
    assert.equal(twice, once);
    const statuses = regionStatuses(await evaluate(once));
    assert.deepEqual(statuses.map((s) => s.state), ['current', 'current']);
  });

  it('keeps Windows line endings everywhere', async () => {
    const crlf = NOTE.replace(/\n/g, '\r\n');
    const out = await write(crlf);
    assert.ok(!/[^\r]\n/.test(out), 'a bare LF was written');
    assert.equal(await write(out), out);
  });

  it('finds a region stale after a definition it depends on changes', async () => {
    const written = await write(NOTE);
    const changed = written.replace('let p = 10 d ± 1 d', 'let p = 11 d ± 1 d');
    const statuses = regionStatuses(await evaluate(changed));
    assert.deepEqual(statuses.map((s) => s.state), ['stale', 'stale']);
  });

  it('reports a hand-edited region and leaves it alone unless forced', async () => {
    const written = await write(NOTE);
    const edited = written.replace(/q = 30/, 'q = 31');
    assert.notEqual(edited, written);
    const plan = planWrite(edited, await evaluate(edited));
    assert.equal(plan.skipped.length, 1);
    assert.equal(plan.skipped[0]!.state, 'edited');
    assert.equal(plan.text, edited);
    assert.equal(await write(edited, true), written);
  });

  it('never writes under an unclosed fence', async () => {
    const text = 'intro\n```orbit\nlet p = 1 d\n';
    const plan = planWrite(text, await evaluate(text));
    assert.equal(plan.text, text);
    assert.equal(plan.skipped[0]!.state, 'unclosed');
  });

  it('finds the same blocks again in the written note (region is not parsed as a block)', async () => {
    const out = await write(NOTE);
    assert.equal(extractBlocks(out).length, 2);
  });

  it('writes a region inside the list item or quote that holds the block, and finds it again', async () => {
    const text = '- item\n\n  ```orbit\n  let b = 2 d\n  ```\n\n  more item text\n- next\n\n> ```orbit\n> let c = 3 d\n> ```\n';
    const out = await write(text);
    assert.match(out, /\n {2}<!-- orbit results · [^\n]*\n {2}- `let b = 2 d` → b = 2 d\n/);
    assert.match(out, /\n> <!-- orbit results · [^\n]*\n> - `let c = 3 d` → c = 3 d\n/);
    assert.match(out, /\n {2}<!-- orbit results end -->\n\n {2}more item text\n- next\n/);
    assert.deepEqual(regionStatuses(await evaluate(out)).map((s) => s.state), ['current', 'current']);
    assert.equal(await write(out), out);
  });

  it('keeps all text outside regions byte-identical and is idempotent, for random notes (property)', async () => {
    const prose = fc.stringMatching(/^[a-zA-Z0-9 #*|`<>!\-.\r\n]{0,60}$/);
    const stmt = fc.constantFrom('let a1 = 3 d', 'date 2000-01-01', 'let bad = 1 d + 1 deg', 'synodic 10 d 12 d', 'nonsense here', '', '# comment');
    const block = fc.tuple(fc.array(stmt, { maxLength: 4 }), fc.constantFrom('```', '~~~', '````')).map(([ss, f]) => `${f}orbit\n${ss.join('\n')}\n${f}`);
    await fc.assert(fc.asyncProperty(fc.array(fc.oneof(prose, block), { minLength: 1, maxLength: 6 }), fc.constantFrom('\n', '\r\n'), async (parts, eol) => {
      const text = parts.join('\n\n').replace(/\r?\n/g, eol);
      const out = await write(text);
      assert.equal(stripRegions(out), text);
      assert.equal(await write(out), out);
    }), { numRuns: 300 });
  });
});
