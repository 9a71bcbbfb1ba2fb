/**
 * The markdown-it plugin shared by the VS Code preview and the standalone HTML export:
 * a pure `(md, options) => md` that claims only `orbit` fences (every other fence goes to
 * the previous rule), keeps the fence's attributes so the preview's `data-line` scroll
 * sync survives, renders results from a lookup (markdown-it cannot await), and hides a
 * generated region when live results are shown in its place.
 */
import type { MarkdownIt } from 'markdown-it';
import { extractBlocks, orbitInfo } from '../../language/extract.js';
import { blockHtml, escapeHtml, type HtmlBlockOptions, type HtmlStatement } from './html.js';
import type { Diagnostic } from '../../language/diagnostics.js';

export interface PreviewBlock {
  readonly statements: readonly HtmlStatement[];
  readonly diagnostics: readonly Diagnostic[];
  readonly status?: HtmlBlockOptions['status'];
}

/**
 * markdown-it's render environment. The VS Code preview puts the rendered document's URI
 * in `currentDocument`, which lets the lookup pick the right note.
 */
export interface RenderEnv { readonly currentDocument?: { toString(): string } }

export interface OrbitPluginOptions {
  /**
   * Results for the block whose opening fence is on `fenceLine` (0-based, in the source
   * the preview renders), or undefined when none are available yet.
   */
  readonly lookup: (fenceLine: number, content: string, env: RenderEnv) => PreviewBlock | undefined;
  /** Shown in place of results that are not available yet. */
  readonly pendingText?: string;
}

export function orbitPlugin(md: MarkdownIt, options: OrbitPluginOptions): MarkdownIt {
  md.renderer.rules['orbit_hidden'] = () => '';
  const previousFence = md.renderer.rules.fence;
  md.renderer.rules.fence = (tokens, idx, opts, env, self) => {
    const token = tokens[idx]!;
    const name = orbitInfo(token.info);
    if (name === undefined) {
      return previousFence ? previousFence(tokens, idx, opts, env, self) : self.renderToken(tokens, idx, opts);
    }
    try {
      token.attrJoin('class', 'orbit-fence');
      const fenceLine = token.map?.[0] ?? -1;
      const found = options.lookup(fenceLine, token.content, (env ?? {}) as RenderEnv);
      const attrs = self.renderAttrs(token);
      if (!found) {
        return `<div${attrs}><pre class="orbit-source"><code>${escapeHtml(token.content)}</code></pre><div class="orbit-pending">${escapeHtml(options.pendingText ?? 'results are being computed…')}</div></div>`;
      }
      const html = blockHtml(found.statements, found.diagnostics, { ...(name ? { name } : {}), ...(found.status ? { status: found.status } : {}) });
      return `<div${attrs}>${html}</div>`;
    } catch (err) {
      return `<div class="orbit-block orbit-render-error">Orbit Notes could not render this block: ${escapeHtml(err instanceof Error ? err.message : String(err))}</div>`;
    }
  };

  // Hide the generated region under a block with live results: the block already shows
  // them. Regions are found by the same extractor as everywhere else, and every token
  // whose source lines fall inside one is hidden (whatever markdown-it made of it).
  md.core.ruler.after('block', 'orbit-hide-regions', (state) => {
    const hidden: Array<readonly [number, number]> = [];
    for (const b of extractBlocks(state.src)) {
      if (b.region?.endLine === undefined) continue;
      if (options.lookup(b.fenceLine, `${b.content}\n`, (state.env ?? {}) as RenderEnv) === undefined) continue;
      hidden.push([b.region.beginLine, b.region.endLine]);
    }
    if (hidden.length === 0) return true;
    const hide = (t: (typeof state.tokens)[number]): void => {
      t.hidden = true;
      t.type = 'orbit_hidden';
      t.content = '';
      t.children = [];
    };
    // Hide a token that starts inside a region and everything up to its closing token.
    let depth = 0;
    for (const t of state.tokens) {
      if (depth > 0) { depth += t.nesting; hide(t); continue; }
      if (t.map && hidden.some(([a, z]) => t.map![0] >= a && t.map![0] <= z)) {
        depth = t.nesting > 0 ? 1 : 0;
        hide(t);
      }
    }
    return true;
  });
  return md;
}

/** The stored region's state, in words for the block header. */
const STATUS_TEXT: Readonly<Record<string, { text: string; kind: NonNullable<HtmlBlockOptions['status']>['kind'] }>> = {
  current: { text: 'stored results match', kind: 'ok' },
  stale: { text: 'stored results are out of date', kind: 'stale' },
  missing: { text: 'no stored results yet', kind: 'stale' },
  edited: { text: 'stored results were edited by hand', kind: 'edited' },
  damaged: { text: 'stored results region is damaged', kind: 'error' },
  unclosed: { text: 'fence not closed', kind: 'error' },
};

/** A block evaluation as the preview shows it, with the state of its stored region. */
export function previewBlockOf(
  b: { readonly statements: ReadonlyArray<{ readonly source: string; readonly statement: { readonly range: { readonly start: { readonly line: number } } }; readonly result?: import('../result.js').StatementResult; readonly diagnostics: readonly Diagnostic[] }>; readonly diagnostics: readonly Diagnostic[] },
  regionState: string | undefined,
): PreviewBlock {
  const status = regionState ? STATUS_TEXT[regionState] : undefined;
  return {
    statements: b.statements.map((s) => ({ source: s.source, line: s.statement.range.start.line, diagnostics: s.diagnostics, ...(s.result ? { result: s.result } : {}) })),
    diagnostics: b.diagnostics,
    ...(status ? { status } : {}),
  };
}
