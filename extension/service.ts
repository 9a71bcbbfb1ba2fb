/**
 * The evaluation service: per open note, a debounced re-evaluation after edits, run in a
 * worker thread. The worker keeps one note evaluator per note, so an edit recomputes
 * only the statements whose inputs changed. A newer edit cancels the evaluation in
 * flight (through a shared flag the searches poll), and a result is applied only to the
 * document version it was computed for.
 */
import * as path from 'node:path';
import { Worker } from 'node:worker_threads';
import * as vscode from 'vscode';
import { FileAccessError, type NoteEvaluation } from '../compute/note.js';
import { readNoteFile } from './files.js';
import { LineTracker } from './lineTracker.js';
import { CANCEL_SLOT, type FromWorker, type ToWorker } from './protocol.js';
import { readSettings } from './settings.js';

/** What the editor shows for a note: its last evaluation, mapped onto the current text. */
export interface NoteView {
  readonly uri: vscode.Uri;
  /** The last evaluation applied (undefined before the first one arrives). */
  readonly evaluation: NoteEvaluation | undefined;
  /** The document version `evaluation` was computed for. */
  readonly evaluatedVersion: number;
  /** Maps a line of the evaluated text to the current text (undefined: edited since). */
  readonly tracker: LineTracker;
  /** True when the document changed after `evaluation` was computed. */
  readonly stale: boolean;
  /** True while an evaluation for this note runs. */
  readonly running: boolean;
  /** Progress of the running evaluation: statements evaluated afresh so far, and the line in work. */
  readonly progress: { readonly done: number; readonly total: number; readonly line: number } | undefined;
}

interface NoteState {
  uri: vscode.Uri;
  evaluation: NoteEvaluation | undefined;
  evaluatedVersion: number;
  tracker: LineTracker;
  stale: boolean;
  timer: NodeJS.Timeout | undefined;
  running: Request | undefined;
  /** Called when the running request ends, to start the next one. */
  queued: boolean;
  progress: { done: number; total: number; line: number } | undefined;
  /** The data files the last evaluation read: URI as text → modification time when read. */
  filesRead: Map<string, number>;
  /** Waiters for the next applied evaluation. */
  waiters: Array<(view: NoteView) => void>;
  /** Waiters for the end of the run in flight, applied or not. */
  runEnded: Array<() => void>;
}

interface Request {
  readonly id: number;
  readonly key: string;
  readonly version: number;
  readonly flag: Int32Array;
  readonly startedMs: number;
  readonly filesRead: Map<string, number>;
  readonly resolve: (evaluation: NoteEvaluation | undefined) => void;
}

/** A quick test that a note has an `orbit` fence at all, before handing it to the worker. */
const HAS_ORBIT_FENCE = /^[ \t]{0,3}(`{3,}|~{3,})[ \t]*orbit\b/m;

/** Whether a text has something that looks like an `orbit` fence (cheap; the extractor decides). */
export function hasOrbitFence(text: string): boolean {
  return HAS_ORBIT_FENCE.test(text);
}

/** Whether a document can be a note: Markdown in a real or virtual file system (not diffs or output). */
export function isNoteDocument(doc: vscode.TextDocument): boolean {
  return doc.languageId === 'markdown' && !['git', 'output', 'vscode-scm', 'comment'].includes(doc.uri.scheme);
}

/** One per extension activation: owns the worker, the notes' states and their events. */
export class EvaluationService implements vscode.Disposable {
  private readonly notes = new Map<string, NoteState>();
  private readonly requests = new Map<number, Request>();
  private readonly disposables: vscode.Disposable[] = [];
  /** One watcher per data file some note read (a watcher on one file is told reliably and cheaply). */
  private readonly fileWatchers = new Map<string, vscode.Disposable>();
  private readonly changed = new vscode.EventEmitter<NoteView>();
  private readonly evaluated = new vscode.EventEmitter<NoteView>();
  private worker: Worker | undefined;
  private nextId = 1;

  /** Any change of a note's view: edits (stale), progress, applied results. */
  readonly onDidChange = this.changed.event;
  /** A new evaluation was applied to a note. */
  readonly onDidEvaluate = this.evaluated.event;

  constructor(private readonly workerPath: string, private readonly output: vscode.OutputChannel) {
    this.disposables.push(
      this.changed, this.evaluated,
      vscode.workspace.onDidOpenTextDocument((d) => this.schedule(d, 0)),
      vscode.workspace.onDidChangeTextDocument((e) => this.onEdit(e)),
      vscode.workspace.onDidCloseTextDocument((d) => this.forget(d.uri)),
      vscode.workspace.onDidGrantWorkspaceTrust(() => this.reevaluateAll()),
      // Saves of data files open in the editor, in case the file watcher is slow to tell.
      vscode.workspace.onDidSaveTextDocument((d) => this.onFileChanged(d.uri)),
      // Back from another program: catch data files it rewrote, should the watcher have missed it.
      vscode.window.onDidChangeWindowState((w) => { if (w.focused) void this.checkFileTimes(); }),
      vscode.workspace.onDidChangeConfiguration((e) => {
        if (e.affectsConfiguration('orbitNotes.limits')) this.reevaluateAll();
      }),
    );
    for (const d of vscode.workspace.textDocuments) this.schedule(d, 0);
  }

  /** The view of a note, or undefined when it is not tracked. */
  view(uri: vscode.Uri): NoteView | undefined {
    const s = this.notes.get(uri.toString());
    return s ? this.viewOf(s) : undefined;
  }

  /** Every tracked note's view. */
  views(): NoteView[] {
    return [...this.notes.values()].map((s) => this.viewOf(s));
  }

  /** Is any evaluation running? */
  get busy(): boolean {
    return this.requests.size > 0;
  }

  /**
   * Evaluate the document's current text now (no debounce) and return the evaluation for
   * exactly that version, or undefined when the document changed before it finished.
   */
  async evaluateNow(doc: vscode.TextDocument): Promise<{ evaluation: NoteEvaluation; version: number } | undefined> {
    const state = this.stateFor(doc.uri);
    clearTimeout(state.timer);
    state.timer = undefined;
    // Wait for a run in flight (its result may be for this very version).
    while (state.running) {
      await new Promise<void>((resolve) => state.runEnded.push(resolve));
    }
    clearTimeout(state.timer);
    state.timer = undefined;
    if (state.evaluation && state.evaluatedVersion === doc.version && !state.stale) {
      return { evaluation: state.evaluation, version: doc.version };
    }
    const version = doc.version;
    const evaluation = await this.start(state, doc);
    return evaluation && doc.version === version ? { evaluation, version } : undefined;
  }

  /** Resolves with the note's view after its next applied evaluation (or at once when it is current). */
  whenEvaluated(uri: vscode.Uri, timeoutMs = 60_000): Promise<NoteView> {
    const state = this.stateFor(uri);
    const doc = vscode.workspace.textDocuments.find((d) => d.uri.toString() === uri.toString());
    if (state.evaluation && !state.stale && !state.running && !state.timer && doc && state.evaluatedVersion === doc.version) {
      return Promise.resolve(this.viewOf(state));
    }
    return new Promise((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error(`no evaluation of ${uri.toString()} within ${timeoutMs} ms`)), timeoutMs);
      state.waiters.push((v) => { clearTimeout(timer); resolve(v); });
    });
  }

  /** Resolves with the note's view after the next evaluation applied from now on. */
  nextEvaluation(uri: vscode.Uri, timeoutMs = 60_000): Promise<NoteView> {
    const state = this.stateFor(uri);
    return new Promise((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error(`no new evaluation of ${uri.toString()} within ${timeoutMs} ms`)), timeoutMs);
      state.waiters.push((v) => { clearTimeout(timer); resolve(v); });
    });
  }

  /** Cancel every running evaluation (searches stop at their next check). */
  cancelAll(): number {
    for (const r of this.requests.values()) Atomics.store(r.flag, CANCEL_SLOT, 1);
    return this.requests.size;
  }

  /** Re-evaluate every tracked note (trust granted, limits changed). */
  reevaluateAll(): void {
    this.post({ type: 'clearCaches' });
    for (const d of vscode.workspace.textDocuments) {
      const s = this.notes.get(d.uri.toString());
      if (s) s.stale = true;
      this.schedule(d, 0);
    }
  }

  dispose(): void {
    this.cancelAll();
    for (const s of this.notes.values()) clearTimeout(s.timer);
    for (const d of this.disposables) d.dispose();
    for (const w of this.fileWatchers.values()) w.dispose();
    this.fileWatchers.clear();
    void this.worker?.terminate();
    this.worker = undefined;
  }

  private viewOf(s: NoteState): NoteView {
    return {
      uri: s.uri, evaluation: s.evaluation, evaluatedVersion: s.evaluatedVersion, tracker: s.tracker,
      stale: s.stale, running: s.running !== undefined, progress: s.progress,
    };
  }

  private stateFor(uri: vscode.Uri): NoteState {
    const key = uri.toString();
    let s = this.notes.get(key);
    if (!s) {
      s = {
        uri, evaluation: undefined, evaluatedVersion: -1, tracker: new LineTracker(), stale: false,
        timer: undefined, running: undefined, queued: false, progress: undefined, filesRead: new Map(), waiters: [], runEnded: [],
      };
      this.notes.set(key, s);
    }
    return s;
  }

  private onEdit(e: vscode.TextDocumentChangeEvent): void {
    if (e.contentChanges.length === 0) return;
    const s = this.notes.get(e.document.uri.toString());
    if (s) {
      for (const c of e.contentChanges) s.tracker.apply(c.range.start.line, c.range.end.line, countLineBreaks(c.text));
      s.stale = true;
      // An evaluation in flight is for an older version now: stop its searches.
      if (s.running) Atomics.store(s.running.flag, CANCEL_SLOT, 1);
      this.changed.fire(this.viewOf(s));
    }
    this.schedule(e.document, readSettings(e.document.uri).debounceMs);
  }

  private schedule(doc: vscode.TextDocument, delayMs: number): void {
    if (!isNoteDocument(doc)) return;
    const key = doc.uri.toString();
    if (!this.notes.has(key) && !hasOrbitFence(doc.getText())) return;
    const state = this.stateFor(doc.uri);
    clearTimeout(state.timer);
    state.timer = setTimeout(() => {
      state.timer = undefined;
      if (state.running) { state.queued = true; return; }
      void this.start(state, doc);
    }, delayMs);
  }

  private start(state: NoteState, doc: vscode.TextDocument): Promise<NoteEvaluation | undefined> {
    const key = doc.uri.toString();
    const version = doc.version;
    const flag = new Int32Array(new SharedArrayBuffer(4));
    const id = this.nextId++;
    return new Promise<NoteEvaluation | undefined>((resolve) => {
      const request: Request = { id, key, version, flag, startedMs: Date.now(), filesRead: new Map(), resolve };
      this.requests.set(id, request);
      state.running = request;
      state.progress = undefined;
      this.changed.fire(this.viewOf(state));
      this.post({ type: 'evaluate', id, key, text: doc.getText(), limits: readSettings(doc.uri).limits, cancel: flag.buffer as SharedArrayBuffer });
    });
  }

  private finish(request: Request, evaluation: NoteEvaluation | undefined): void {
    this.requests.delete(request.id);
    const state = this.notes.get(request.key);
    if (!state) { request.resolve(undefined); return; }
    if (state.running === request) state.running = undefined;
    state.progress = undefined;
    const doc = vscode.workspace.textDocuments.find((d) => d.uri.toString() === request.key);
    // Apply only to the version it was computed for; a newer edit has its own run queued.
    // (A run cancelled by the user for the same version is applied: it shows what was cancelled.)
    const current = doc !== undefined && doc.version === request.version;
    if (evaluation && current) {
      state.evaluation = evaluation;
      state.evaluatedVersion = request.version;
      state.tracker = new LineTracker();
      state.stale = false;
      state.filesRead = request.filesRead;
      this.updateFileWatchers();
      const ms = Date.now() - request.startedMs;
      if (evaluation.evaluated > 0) this.output.appendLine(`${shortName(state.uri)} v${request.version}: ${evaluation.evaluated} statement(s) evaluated, ${evaluation.reused} reused, ${ms} ms`);
    }
    request.resolve(evaluation && current ? evaluation : undefined);
    const view = this.viewOf(state);
    if (evaluation && current) {
      this.evaluated.fire(view);
      for (const w of state.waiters.splice(0)) w(view);
    }
    for (const w of state.runEnded.splice(0)) w();
    this.changed.fire(view);
    if (doc && (state.queued || (state.stale && !state.timer && !state.running))) {
      state.queued = false;
      void this.start(state, doc);
    }
  }

  private forget(uri: vscode.Uri): void {
    const key = uri.toString();
    const s = this.notes.get(key);
    if (!s) return;
    clearTimeout(s.timer);
    if (s.running) Atomics.store(s.running.flag, CANCEL_SLOT, 1);
    this.notes.delete(key);
    this.updateFileWatchers();
    this.post({ type: 'forget', key });
  }

  /** Watch exactly the data files the notes' last evaluations read. */
  private updateFileWatchers(): void {
    const wanted = new Set<string>();
    for (const s of this.notes.values()) for (const f of s.filesRead.keys()) wanted.add(f);
    for (const [f, w] of this.fileWatchers) {
      if (!wanted.has(f)) { w.dispose(); this.fileWatchers.delete(f); }
    }
    for (const f of wanted) {
      if (this.fileWatchers.has(f)) continue;
      const uri = vscode.Uri.parse(f);
      const watcher = vscode.workspace.createFileSystemWatcher(new vscode.RelativePattern(vscode.Uri.joinPath(uri, '..'), path.posix.basename(uri.path)), false, false, false);
      const changed = (): void => this.onFileChanged(uri);
      this.fileWatchers.set(f, vscode.Disposable.from(watcher, watcher.onDidChange(changed), watcher.onDidCreate(changed), watcher.onDidDelete(changed)));
    }
  }

  /** Re-evaluate notes whose data files changed on disk since they were read. */
  private async checkFileTimes(): Promise<void> {
    const times = new Map<string, number>();
    for (const s of this.notes.values()) for (const [f, t] of s.filesRead) times.set(f, t);
    for (const [f, readMs] of times) {
      let nowMs: number | undefined;
      try { nowMs = (await vscode.workspace.fs.stat(vscode.Uri.parse(f))).mtime; } catch { nowMs = undefined; }
      if (nowMs !== readMs) this.onFileChanged(vscode.Uri.parse(f));
    }
  }

  private onFileChanged(uri: vscode.Uri): void {
    const changed = uri.toString();
    for (const s of this.notes.values()) {
      if (!s.filesRead.has(changed)) continue;
      const doc = vscode.workspace.textDocuments.find((d) => d.uri.toString() === s.uri.toString());
      if (!doc) continue;
      this.output.appendLine(`${shortName(uri)} changed: re-evaluating ${shortName(s.uri)}`);
      s.stale = true;
      this.changed.fire(this.viewOf(s));
      this.schedule(doc, 0);
    }
  }

  private post(message: ToWorker): void {
    this.ensureWorker().postMessage(message);
  }

  private ensureWorker(): Worker {
    if (this.worker) return this.worker;
    const worker = new Worker(this.workerPath);
    worker.on('message', (m: FromWorker) => this.onWorkerMessage(m));
    worker.on('error', (err) => this.output.appendLine(`evaluation worker failed: ${err.stack ?? err.message}`));
    worker.on('exit', (code) => {
      if (this.worker !== worker) return;
      this.worker = undefined;
      this.output.appendLine(`evaluation worker exited (code ${code}); it restarts on the next evaluation`);
      for (const r of [...this.requests.values()]) this.finish(r, undefined);
    });
    this.worker = worker;
    return worker;
  }

  private onWorkerMessage(m: FromWorker): void {
    switch (m.type) {
      case 'progress': {
        const r = this.requests.get(m.id);
        const s = r && this.notes.get(r.key);
        if (!s || s.running !== r) return;
        s.progress = { done: m.done, total: m.total, line: m.line };
        this.changed.fire(this.viewOf(s));
        return;
      }
      case 'read': {
        const r = this.requests.get(m.id);
        const s = r && this.notes.get(r.key);
        if (!r || !s) {
          this.post({ type: 'readResult', readId: m.readId, error: { message: 'the evaluation was cancelled', reason: 'unreadable' } });
          return;
        }
        readNoteFile(s.uri, m.path).then(
          (o) => { r.filesRead.set(o.uri.toString(), o.mtimeMs); this.post({ type: 'readResult', readId: m.readId, text: o.text }); },
          (err: unknown) => this.post({
            type: 'readResult', readId: m.readId,
            error: err instanceof FileAccessError
              ? { message: err.message, reason: err.reason }
              : { message: `cannot read \`${m.path}\`: ${err instanceof Error ? err.message : String(err)}`, reason: 'unreadable' },
          }),
        );
        return;
      }
      case 'result':
      case 'failed': {
        const r = this.requests.get(m.id);
        if (!r) return;
        if (m.type === 'failed') this.output.appendLine(`evaluation failed: ${m.message}`);
        this.finish(r, m.type === 'result' ? m.evaluation : undefined);
        return;
      }
      case 'log':
        this.output.appendLine(m.message);
        return;
    }
  }
}

function countLineBreaks(text: string): number {
  let n = 0;
  for (let i = 0; i < text.length; i++) if (text.charCodeAt(i) === 10) n++;
  return n;
}

function shortName(uri: vscode.Uri): string {
  return path.posix.basename(uri.path);
}
