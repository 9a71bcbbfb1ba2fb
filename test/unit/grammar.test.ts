import { strict as assert } from 'node:assert';
import * as fs from 'node:fs';
import * as path from 'node:path';
import * as oniguruma from 'vscode-oniguruma';
import * as vsctm from 'vscode-textmate';
import { STATEMENT_KEYWORDS } from '../../language/ast.js';
import { FUNCTIONS, OPTION_WORDS } from '../../language/parser.js';
import { UNIT_NAMES } from '../../compute/quantity.js';

/**
 * Tokenisation snapshot tests of the ```orbit injection grammar, run with the same
 * TextMate engine and Oniguruma build that VS Code uses, over the Markdown grammar VS Code
 * ships (as packaged in tm-grammars). Set UPDATE_GRAMMAR_SNAPSHOTS=1 to rewrite the
 * expected dumps after an intended change, then review the diff.
 */
const ORBIT_GRAMMAR = path.resolve(__dirname, '../../syntaxes/orbit.injection.tmLanguage.json');
const MARKDOWN_GRAMMAR = require.resolve('tm-grammars/grammars/markdown.json');
const FIXTURES = path.resolve(__dirname, '../fixtures/grammar');
const ORBIT_SCOPE = 'markdown.orbit.codeblock';

async function loadMarkdownGrammar(): Promise<vsctm.IGrammar> {
  const wasm = fs.readFileSync(require.resolve('vscode-oniguruma/release/onig.wasm'));
  await oniguruma.loadWASM(wasm.buffer.slice(wasm.byteOffset, wasm.byteOffset + wasm.byteLength));
  const registry = new vsctm.Registry({
    onigLib: Promise.resolve({
      createOnigScanner: (patterns: string[]) => new oniguruma.OnigScanner(patterns),
      createOnigString: (s: string) => new oniguruma.OnigString(s),
    }),
    loadGrammar: async (scopeName: string) => {
      const file = scopeName === 'text.html.markdown' ? MARKDOWN_GRAMMAR : scopeName === ORBIT_SCOPE ? ORBIT_GRAMMAR : undefined;
      return file ? vsctm.parseRawGrammar(fs.readFileSync(file, 'utf8'), file) : null;
    },
    // What `injectTo: ["text.html.markdown"]` does in the extension manifest.
    getInjections: (scopeName: string) => (scopeName === 'text.html.markdown' ? [ORBIT_SCOPE] : undefined),
  });
  const grammar = await registry.loadGrammar('text.html.markdown');
  assert.ok(grammar, 'the Markdown grammar loads');
  return grammar;
}

interface Tok { readonly line: number; readonly text: string; readonly scopes: readonly string[] }

function tokenizeText(grammar: vsctm.IGrammar, text: string): Tok[] {
  const out: Tok[] = [];
  let state = vsctm.INITIAL;
  text.split('\n').forEach((line, i) => {
    const r = grammar.tokenizeLine(line, state);
    for (const t of r.tokens) out.push({ line: i, text: line.slice(t.startIndex, t.endIndex), scopes: t.scopes });
    state = r.ruleStack;
  });
  return out;
}

/** One line per token: `line: "text"  scope scope …` (the root scope left out). */
function dump(tokens: readonly Tok[]): string {
  return tokens.filter((t) => t.text !== '').map((t) => `${t.line + 1}: ${JSON.stringify(t.text)}  ${t.scopes.slice(1).join(' ')}`).join('\n') + '\n';
}

describe('orbit injection grammar', () => {
  let grammar: vsctm.IGrammar;
  before(async () => { grammar = await loadMarkdownGrammar(); });

  const tokensOf = (text: string): Tok[] => tokenizeText(grammar, text);
  const scopeOf = (text: string, word: string): readonly string[] => {
    const t = tokensOf(text).find((x) => x.text === word);
    assert.ok(t, `no token ${JSON.stringify(word)} in ${JSON.stringify(tokensOf(text).map((x) => x.text))}`);
    return t.scopes;
  };
  const inBlock = (body: string): string => `\`\`\`orbit\n${body}\n\`\`\`\n`;

  for (const fixture of fs.readdirSync(path.resolve(__dirname, '../fixtures/grammar')).filter((f) => f.endsWith('.md'))) {
    it(`tokenises ${fixture} exactly as its committed snapshot`, () => {
      const text = fs.readFileSync(path.join(FIXTURES, fixture), 'utf8');
      const actual = dump(tokensOf(text));
      const snapshot = path.join(FIXTURES, `${fixture}.tokens`);
      if (process.env['UPDATE_GRAMMAR_SNAPSHOTS'] === '1') fs.writeFileSync(snapshot, actual);
      assert.ok(fs.existsSync(snapshot), `missing snapshot ${snapshot}: run with UPDATE_GRAMMAR_SNAPSHOTS=1 and review it`);
      assert.equal(actual, fs.readFileSync(snapshot, 'utf8'));
    });
  }

  it('embeds the content of an orbit fence, and only of an orbit fence', () => {
    const text = '```orbit name\ndate 2031\n```\n```python\ndate = 1\n```\n```orbitals\ndate 2031\n```\nafter';
    const lines = tokensOf(text);
    const embedded = (line: number): boolean => lines.filter((t) => t.line === line && t.text.trim() !== '').every((t) => t.scopes.includes('meta.embedded.block.orbit'));
    assert.equal(embedded(1), true);
    assert.equal(embedded(4), false);
    assert.equal(embedded(7), false);
    assert.equal(lines.some((t) => t.line === 9 && t.scopes.includes('meta.embedded.block.orbit')), false);
    assert.ok(!lines.some((t) => t.line === 2 && t.scopes.includes('meta.embedded.block.orbit')), 'the closing fence is not embedded');
  });

  it('does not claim a bare fence whose first line is the word orbit', () => {
    const lines = tokensOf('```\norbit\ndate 2031\n```\n');
    assert.equal(lines.some((t) => t.scopes.includes('meta.embedded.block.orbit')), false);
  });

  it('closes an orbit fence inside a list item, so that the text after it is Markdown again', () => {
    const lines = tokensOf('- item\n\n  ```orbit\n  ratio jupiter saturn\n  ```\n\nafter\n');
    assert.ok(lines.some((t) => t.line === 3 && t.text === 'ratio' && t.scopes.includes('keyword.control.statement.orbit')));
    const close = lines.find((t) => t.line === 4 && t.text === '```');
    assert.ok(close?.scopes.includes('punctuation.definition.markdown'), JSON.stringify(close));
    assert.ok(lines.some((t) => t.line === 6 && t.scopes.includes('meta.paragraph.markdown')));
  });

  it('gives every statement keyword of the parser the statement scope', () => {
    for (const kw of STATEMENT_KEYWORDS) {
      assert.ok(scopeOf(inBlock(`${kw} x`), kw).includes('keyword.control.statement.orbit'), kw);
    }
  });

  it('gives every option word of the parser the option scope', () => {
    for (const w of OPTION_WORDS) {
      assert.ok(scopeOf(inBlock(`ratio a ${w} b`), w).includes('keyword.other.option.orbit'), w);
    }
  });

  it('gives every unit spelling of the language the unit scope after a number', () => {
    for (const u of UNIT_NAMES) {
      assert.ok(scopeOf(inBlock(`let x = 3 ${u}`), u).includes('keyword.other.unit.orbit'), u);
    }
  });

  it('gives every function of the parser the function scope before its parenthesis', () => {
    for (const f of Object.keys(FUNCTIONS)) {
      assert.ok(scopeOf(inBlock(`let x = ${f}(a)`), f).includes('support.function.orbit'), f);
    }
  });

  it('keeps a # inside a string out of the comment', () => {
    const s = scopeOf(inBlock('series s from "a#b.csv" time t value v # real comment'), '"a#b.csv"');
    assert.ok(s.includes('string.quoted.double.orbit'));
    assert.ok(scopeOf(inBlock('date 2030 # real comment'), '# real comment').includes('comment.line.number-sign.orbit'));
  });

  it('reads a subtraction of small numbers as numbers, not as a date', () => {
    assert.ok(scopeOf(inBlock('let x = 3-2'), '3').includes('constant.numeric.orbit'));
    assert.ok(scopeOf(inBlock('date 2031-03-14 06:30 TT'), '2031-03-14 06:30').includes('constant.numeric.date.orbit'));
  });
});
