/**
 * The evaluation worker: runs the note evaluator off the extension host's main thread,
 * one evaluator (and result cache) per note. Data files are read by the extension host
 * (which enforces workspace confinement and trust) on request.
 */
import { parentPort } from 'node:worker_threads';
import type { Limits } from '../compute/limits.js';
import { createNoteEvaluator, FileAccessError, type NoteEvaluator } from '../compute/note.js';
import { CANCEL_SLOT, type FromWorker, type ToWorker } from './protocol.js';

const port = parentPort;
if (!port) throw new Error('worker.js must run as a worker thread');

const evaluators = new Map<string, { evaluator: NoteEvaluator; limitsKey: string }>();
const pendingReads = new Map<number, { resolve: (text: string) => void; reject: (err: Error) => void }>();
let nextReadId = 1;
/** Per note, the id of its request in flight: the service runs one at a time per note, so reads route by note. */
const currentRequest = new Map<string, number>();

function post(message: FromWorker): void {
  port!.postMessage(message);
}

function evaluatorFor(key: string, limits: Limits): NoteEvaluator {
  const limitsKey = JSON.stringify(limits);
  const existing = evaluators.get(key);
  if (existing && existing.limitsKey === limitsKey) return existing.evaluator;
  const evaluator = createNoteEvaluator({
    limits,
    log: (message) => post({ type: 'log', message }),
    host: {
      readText: (path) => new Promise<string>((resolve, reject) => {
        const readId = nextReadId++;
        pendingReads.set(readId, { resolve, reject });
        post({ type: 'read', id: currentRequest.get(key) ?? 0, readId, path });
      }),
    },
  });
  evaluators.set(key, { evaluator, limitsKey });
  return evaluator;
}

port.on('message', (message: ToWorker) => {
  switch (message.type) {
    case 'evaluate': {
      const flag = new Int32Array(message.cancel);
      currentRequest.set(message.key, message.id);
      const evaluator = evaluatorFor(message.key, message.limits);
      evaluator.evaluate(message.text, {
        cancel: { isCancelled: () => Atomics.load(flag, CANCEL_SLOT) === 1 },
        onProgress: (done, total, statement) => post({ type: 'progress', id: message.id, done, total, line: statement.range.start.line }),
      }).then(
        (evaluation) => post({ type: 'result', id: message.id, evaluation }),
        (err: unknown) => post({ type: 'failed', id: message.id, message: err instanceof Error ? err.stack ?? err.message : String(err) }),
      );
      break;
    }
    case 'readResult': {
      const pending = pendingReads.get(message.readId);
      if (!pending) break;
      pendingReads.delete(message.readId);
      if (message.error) pending.reject(new FileAccessError(message.error.message, message.error.reason));
      else pending.resolve(message.text ?? '');
      break;
    }
    case 'forget':
      evaluators.delete(message.key);
      currentRequest.delete(message.key);
      break;
    case 'clearCaches':
      for (const e of evaluators.values()) e.evaluator.clearCache();
      break;
  }
});
