/**
 * Maps lines of the text an evaluation was computed for onto the document as edited
 * since, so stale results stay beside their statements until fresh ones arrive.
 */
export class LineTracker {
  private readonly changes: Array<{ readonly startLine: number; readonly endLine: number; readonly delta: number }> = [];

  /**
   * Record an edit that replaced lines [startLine, endLine] (inclusive, in the text as it
   * was just before this edit) with text holding `newLineBreaks` line breaks.
   */
  apply(startLine: number, endLine: number, newLineBreaks: number): void {
    this.changes.push({ startLine, endLine, delta: newLineBreaks - (endLine - startLine) });
  }

  /** True when no edit happened since the evaluation. */
  get identity(): boolean {
    return this.changes.length === 0;
  }

  /** The current line of an evaluated line, or undefined when an edit touched it. */
  map(line: number): number | undefined {
    let l = line;
    for (const c of this.changes) {
      if (l < c.startLine) continue;
      if (l > c.endLine) { l += c.delta; continue; }
      // Typing within one line keeps the line where it is.
      if (c.startLine === c.endLine && c.delta === 0) continue;
      return undefined;
    }
    return l;
  }

  /** The evaluated line a current line came from, or undefined when it was edited or inserted. */
  unmap(line: number): number | undefined {
    let l = line;
    for (let i = this.changes.length - 1; i >= 0; i--) {
      const c = this.changes[i]!;
      if (l < c.startLine) continue;
      if (l > c.endLine + c.delta) { l -= c.delta; continue; }
      if (c.startLine === c.endLine && c.delta === 0) continue;
      return undefined;
    }
    return l;
  }
}
