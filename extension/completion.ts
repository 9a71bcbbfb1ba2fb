/**
 * Completion inside `orbit` blocks: the language layer decides what fits at the cursor;
 * this adapter finds the block (with the one extractor), supplies the names defined
 * above the cursor and converts the items.
 */
import * as vscode from 'vscode';
import { BUILTIN_BODIES } from '../compute/context.js';
import { complete, type CompletionKind } from '../language/completion.js';
import { extractBlocks } from '../language/extract.js';
import { parseBlock } from '../language/parser.js';

const KIND: Readonly<Record<CompletionKind, vscode.CompletionItemKind>> = {
  keyword: vscode.CompletionItemKind.Keyword,
  option: vscode.CompletionItemKind.Property,
  body: vscode.CompletionItemKind.Module,
  name: vscode.CompletionItemKind.Variable,
  unit: vscode.CompletionItemKind.Unit,
};

/** Words as the language spells them: `seen-from`, `up-to`, `deg/d`, `/yr`. */
const WORD_RE = /[A-Za-z_/°][A-Za-z0-9_\-/°]*/;

/** Registers completion for Markdown documents; it answers only inside `orbit` blocks. */
export function registerCompletion(): vscode.Disposable {
  return vscode.languages.registerCompletionItemProvider({ language: 'markdown' }, {
    provideCompletionItems(doc, position) {
      const text = doc.getText();
      const blocks = extractBlocks(text);
      const block = blocks.find((b) => b.contentStartLine <= position.line && position.line < b.closeLine + (b.regionProblem === 'unclosed' ? 1 : 0));
      if (!block) return undefined;
      // Names defined above the cursor, in this block and earlier ones (parsed, so they
      // are offered before the note was evaluated).
      const names: string[] = [];
      const bodies: string[] = [...BUILTIN_BODIES];
      for (const b of blocks) {
        if (b.fenceLine > block.fenceLine) break;
        for (const s of parseBlock(b.content, b.contentStartLine).statements) {
          if (s.range.start.line >= position.line) break;
          if (s.kind === 'let' || s.kind === 'series') names.push(s.name.name);
          if (s.kind === 'body') { names.push(s.name.name); bodies.push(s.name.name); }
        }
      }
      const local = new vscode.Position(position.line, Math.max(0, position.character - block.indent));
      const items = complete(block.content, block.contentStartLine, local, { names, bodies });
      const word = doc.getWordRangeAtPosition(position, WORD_RE);
      const replace = word && word.start.isBefore(position) ? new vscode.Range(word.start, position) : undefined;
      return items.map((i) => {
        const item = new vscode.CompletionItem(i.label, KIND[i.kind]);
        item.detail = i.detail;
        if (replace) item.range = replace;
        return item;
      });
    },
  }, ' ');
}
