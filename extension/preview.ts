/**
 * The Markdown preview: the core's markdown-it plugin with results looked up from the
 * evaluation service (markdown-it cannot await), and a preview refresh whenever new
 * results arrive. A block is matched by its content and fence line in the evaluated note the
 * preview renders (markdown-it's `env.currentDocument`), falling back to other open notes.
 */
import type { MarkdownIt } from 'markdown-it';
import * as vscode from 'vscode';
import { orbitPlugin, previewBlockOf, type PreviewBlock, type RenderEnv } from '../compute/render/markdownItPlugin.js';
import { regionStatuses } from '../compute/writeback.js';
import type { EvaluationService, NoteView } from './service.js';

/** Quiet time before the preview is asked to refresh, so a burst of results refreshes once. */
const REFRESH_DELAY_MS = 100;

/** The plugin `activate` hands to the Markdown extension (`extendMarkdownIt`). */
export function createPreviewPlugin(service: EvaluationService): (md: MarkdownIt) => MarkdownIt {
  const lookup = (fenceLine: number, content: string, env: RenderEnv): PreviewBlock | undefined => {
    const wanted = sameText(content.replace(/\r?\n$/, ''));
    let best: { block: PreviewBlock; exact: boolean } | undefined;
    // The preview names the document it renders; otherwise prefer the active editor's note.
    const active = env.currentDocument?.toString() ?? vscode.window.activeTextEditor?.document.uri.toString();
    const views = service.views().sort((a, b) => Number(b.uri.toString() === active) - Number(a.uri.toString() === active));
    for (const view of views) {
      const found = blockIn(view, fenceLine, wanted);
      if (found && (!best || (found.exact && !best.exact))) best = found;
      if (best?.exact) break;
    }
    return best?.block;
  };
  return (md) => orbitPlugin(md, { lookup, pendingText: 'Orbit Notes: results are being computed…' });
}

function blockIn(view: NoteView, fenceLine: number, content: string): { block: PreviewBlock; exact: boolean } | undefined {
  const evaluation = view.evaluation;
  if (!evaluation) return undefined;
  const statuses = regionStatuses(evaluation);
  let candidate: { block: PreviewBlock; exact: boolean } | undefined;
  for (const [i, b] of evaluation.blocks.entries()) {
    if (sameText(b.block.content) !== content) continue;
    const exact = view.tracker.map(b.block.fenceLine) === fenceLine;
    const base = previewBlockOf(b, statuses[i]?.state);
    const block: PreviewBlock = view.stale || view.running ? { ...base, status: { text: 'updating…', kind: 'computing' } } : base;
    if (exact) return { block, exact };
    candidate ??= { block, exact };
  }
  return candidate;
}

/**
 * Block text compared without indentation: markdown-it strips a fence's container prefix
 * from its content, while the extractor keeps columns by blanking it.
 */
function sameText(content: string): string {
  return content.split(/\r?\n/).map((l) => l.trimStart()).join('\n');
}

/** Refresh open previews after results change. */
export function registerPreviewRefresh(service: EvaluationService): vscode.Disposable {
  let timer: NodeJS.Timeout | undefined;
  const refresh = (): void => {
    clearTimeout(timer);
    timer = setTimeout(() => { void vscode.commands.executeCommand('markdown.preview.refresh'); }, REFRESH_DELAY_MS);
  };
  return vscode.Disposable.from(
    service.onDidEvaluate(refresh),
    { dispose: () => clearTimeout(timer) },
  );
}
