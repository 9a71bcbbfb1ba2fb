/**
 * Inline fixtures with positions marked in the text: `⟦…⟧` marks a range, `‸` the cursor.
 * The markers are removed; positions are returned in document coordinates.
 */
import type { Position, Range } from '../../language/ast.js';

export interface Marked {
  /** The text with every marker removed. */
  readonly content: string;
  /** Every `⟦…⟧` range, in the order of their opening marks. */
  readonly ranges: Range[];
  /** Where `‸` stood, if present. */
  readonly cursor?: Position;
}

/** Strip markers from `text` whose first line is document line `firstLine`. */
export function marked(text: string, firstLine = 0): Marked {
  const ranges: Range[] = [];
  const open: Position[] = [];
  let cursor: Position | undefined;
  let content = '';
  let line = firstLine;
  let character = 0;
  for (const ch of text) {
    if (ch === '⟦') { const at = { line, character }; open.push(at); ranges.push({ start: at, end: at }); continue; }
    if (ch === '⟧') {
      const start = open.pop();
      if (!start) throw new Error('unbalanced ⟧ in fixture');
      const i = ranges.findIndex((r) => r.start === start);
      ranges[i] = { start, end: { line, character } };
      continue;
    }
    if (ch === '‸') { cursor = { line, character }; continue; }
    content += ch;
    if (ch === '\n') { line += 1; character = 0; } else character += ch.length;
  }
  if (open.length > 0) throw new Error('unbalanced ⟦ in fixture');
  return { content, ranges, ...(cursor ? { cursor } : {}) };
}
