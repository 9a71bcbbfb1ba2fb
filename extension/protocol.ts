/**
 * Messages between the extension host and the evaluation worker (worker.ts). Everything
 * that crosses is structured-cloneable plain data; cancellation is a shared flag the
 * worker polls synchronously, so a search in full flight notices it without waiting for
 * the worker's event loop.
 */
import type { Limits } from '../compute/limits.js';
import type { NoteEvaluation } from '../compute/note.js';

/** Index of the cancel flag in a request's shared Int32Array; 1 means cancelled. */
export const CANCEL_SLOT = 0;

/** Messages from the extension host to the worker. */
export type ToWorker =
  | {
    readonly type: 'evaluate';
    readonly id: number;
    /** The note's URI as text: one evaluator (and cache) per key. */
    readonly key: string;
    readonly text: string;
    readonly limits: Limits;
    /** Int32Array(1) over a SharedArrayBuffer. */
    readonly cancel: SharedArrayBuffer;
  }
  | { readonly type: 'readResult'; readonly readId: number; readonly text?: string; readonly error?: { readonly message: string; readonly reason: 'outside-workspace' | 'not-found' | 'unreadable' } }
  | { readonly type: 'forget'; readonly key: string }
  | { readonly type: 'clearCaches' };

/** Messages from the worker to the extension host. */
export type FromWorker =
  | { readonly type: 'progress'; readonly id: number; readonly done: number; readonly total: number; readonly line: number }
  | { readonly type: 'read'; readonly id: number; readonly readId: number; readonly path: string }
  | { readonly type: 'result'; readonly id: number; readonly evaluation: NoteEvaluation }
  | { readonly type: 'failed'; readonly id: number; readonly message: string }
  | { readonly type: 'log'; readonly message: string };
