import { strict as assert } from 'node:assert';
import MarkdownIt from 'markdown-it';
import { createNoteEvaluator } from '../../compute/note.js';
import { orbitPlugin, previewBlockOf } from '../../compute/render/markdownItPlugin.js';
import { planWrite, regionStatuses } from '../../compute/writeback.js';

async function render(text: string, html = true): Promise<string> {
  const e = await createNoteEvaluator().evaluate(text);
  const states = new Map(regionStatuses(e).map((s) => [s.fenceLine, s.state]));
  const byFence = new Map(e.blocks.map((b) => [b.block.fenceLine, previewBlockOf(b, states.get(b.block.fenceLine))]));
  const md = new MarkdownIt({ html });
  orbitPlugin(md, { lookup: (line) => byFence.get(line) });
  return md.render(text);
}

describe('the preview plugin', () => {
  it('renders orbit fences as results and leaves other fences to markdown-it', async () => {
    const html = await render('```js\nlet x = 1 < 2\n```\n\n```orbit\nlet p = 2 d * 3\n```\n');
    assert.match(html, /<pre><code class="language-js">let x = 1 &lt; 2/);
    assert.match(html, /class="orbit-summary">p = 6 d</);
  });

  it('renders markup and script in statements and messages as inert text', async () => {
    const evil = '```orbit <img src=x onerror=alert(1)>\nlet <script>alert(1)</script> = 1 d\nbody b period 1 d # </div><script>x()</script>\n```\n';
    const html = await render(evil);
    assert.ok(!/<script/i.test(html), html);
    assert.ok(!/<img/i.test(html), html);
    assert.match(html, /&lt;script&gt;/);
  });

  it('hides the stored region under a block with live results and says whether it matches', async () => {
    const note = '# n\n\n```orbit\nlet p = 2 d\n```\n\ntext after\n';
    const e = await createNoteEvaluator().evaluate(note);
    const written = planWrite(note, e).text;
    const html = await render(written);
    assert.match(html, /stored results match/);
    assert.ok(!html.includes('orbit results'), 'the region markers are hidden');
    assert.equal((html.match(/>p = 2 d</g) ?? []).length, 1, 'the value is shown once, by the live block');
    assert.match(html, /text after/);
    const stale = await render(written.replace('let p = 2 d', 'let p = 3 d'));
    assert.match(stale, /stored results are out of date/);
  });

  it('keeps the fence token attributes (data-line scroll sync) on the block wrapper', async () => {
    const text = '```orbit\nlet p = 2 d\n```\n';
    const e = await createNoteEvaluator().evaluate(text);
    const md = new MarkdownIt();
    // The preview adds data-line through a core rule; emulate it to see that the plugin keeps attributes.
    md.core.ruler.push('line', (state) => { for (const t of state.tokens) if (t.map && t.nesting >= 0) t.attrSet('data-line', String(t.map[0])); return true; });
    orbitPlugin(md, { lookup: () => previewBlockOf(e.blocks[0]!, undefined) });
    assert.match(md.render(text), /<div data-line="0" class="orbit-fence">/);
  });
});
