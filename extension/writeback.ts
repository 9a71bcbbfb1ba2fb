/**
 * Writing results into notes from the editor. The text is the core's write plan for the
 * exact document version it was computed for, applied as a workspace edit; if the user
 * typed meanwhile (the version moved, or the edit was refused), it is planned again, a
 * few times, and otherwise skipped — a keystroke is never lost.
 */
import * as vscode from 'vscode';
import { planWrite, regionStatuses, type RegionStatus, type TextEdit } from '../compute/writeback.js';
import type { EvaluationService } from './service.js';

/** Attempts before giving up on a note that keeps changing. */
const WRITE_ATTEMPTS = 3;

/** What a write did to one note. */
export interface WriteOutcome {
  readonly uri: vscode.Uri;
  /** Regions written. */
  readonly written: number;
  /** Regions left alone (edited by hand, damaged, unclosed fence). */
  readonly skipped: readonly RegionStatus[];
  /** True when the note kept changing and nothing was written. */
  readonly gaveUp: boolean;
}

/**
 * Write the results of a note (or of one block) into its text.
 * @param blockIndex only this block's region (0-based block index)
 * @param force overwrite regions edited by hand
 */
export async function writeNote(service: EvaluationService, doc: vscode.TextDocument, options: { readonly blockIndex?: number; readonly force?: boolean } = {}): Promise<WriteOutcome> {
  for (let attempt = 0; attempt < WRITE_ATTEMPTS; attempt++) {
    const done = await service.evaluateNow(doc);
    if (!done) continue;
    const text = doc.getText();
    if (doc.version !== done.version) continue;
    const plan = planWrite(text, done.evaluation, options.force ? { force: true } : {});
    let edits: readonly TextEdit[] = plan.edits;
    let skipped = plan.skipped;
    if (options.blockIndex !== undefined) {
      const b = done.evaluation.blocks[options.blockIndex];
      if (!b) return { uri: doc.uri, written: 0, skipped: [], gaveUp: false };
      const at = b.block.region ? b.block.region.beginLine : b.block.closeLine + 1;
      edits = edits.filter((e) => e.startLine === at);
      skipped = skipped.filter((s) => s.blockIndex === options.blockIndex);
    }
    if (edits.length === 0) return { uri: doc.uri, written: 0, skipped, gaveUp: false };
    const edit = new vscode.WorkspaceEdit();
    for (const e of edits) edit.replace(doc.uri, new vscode.Range(doc.positionAt(e.start), doc.positionAt(e.end)), e.text);
    if (doc.version !== done.version) continue;
    // The edit carries the version it was planned for; the editor refuses it if the text moved on.
    if (await vscode.workspace.applyEdit(edit)) return { uri: doc.uri, written: edits.length, skipped, gaveUp: false };
  }
  return { uri: doc.uri, written: 0, skipped: [], gaveUp: true };
}

/** Region states of a note, computed for its current text. */
export async function checkNote(service: EvaluationService, doc: vscode.TextDocument): Promise<RegionStatus[] | undefined> {
  const done = await service.evaluateNow(doc);
  return done ? regionStatuses(done.evaluation) : undefined;
}
