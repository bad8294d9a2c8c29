/**
 * Promise-based client of the analysis worker. One request at a time per kind is enough for the UI;
 * a newer 'analyze' supersedes an older one (its result is dropped), so dragging steps stays smooth.
 */
import type { WorkerRequest, WorkerResponse, WorkerResults } from './protocol';

type Kind = WorkerRequest['type'];
type Payload<K extends Kind> = Omit<Extract<WorkerRequest, { type: K }>, 'id' | 'type'>;
export type ProgressListener = (fraction: number, label: string) => void;

/** Raised when a newer request of the same kind replaced this one. */
export class Superseded extends Error {
  override readonly name = 'Superseded';
}

/** An error the worker reported; `inputError` = the user's input was bad (show it as such). */
export class WorkerError extends Error {
  override readonly name = 'WorkerError';
  constructor(message: string, readonly inputError: boolean) {
    super(message);
  }
}

interface Pending {
  kind: Kind;
  resolve(v: unknown): void;
  reject(e: Error): void;
  onProgress?: ProgressListener;
}

export class AnalysisClient {
  private nextId = 1;
  private readonly pending = new Map<number, Pending>();
  private readonly latest = new Map<Kind, number>();

  constructor(private readonly worker: Worker) {
    worker.onmessage = (ev: MessageEvent<WorkerResponse>) => this.receive(ev.data);
    worker.onerror = (ev) => {
      for (const [, p] of this.pending) p.reject(new WorkerError(`The analysis worker stopped: ${ev.message}`, false));
      this.pending.clear();
    };
  }

  request<K extends Kind>(type: K, payload: Payload<K>, onProgress?: ProgressListener, transfer: Transferable[] = []): Promise<WorkerResults[K]> {
    const id = this.nextId++;
    this.latest.set(type, id);
    return new Promise<WorkerResults[K]>((resolve, reject) => {
      this.pending.set(id, { kind: type, resolve: resolve as (v: unknown) => void, reject, onProgress });
      this.worker.postMessage({ id, type, ...payload } as WorkerRequest, transfer);
    });
  }

  private receive(msg: WorkerResponse): void {
    const p = this.pending.get(msg.id);
    if (!p) return;
    if (msg.type === 'progress') {
      p.onProgress?.(msg.fraction, msg.label);
      return;
    }
    this.pending.delete(msg.id);
    if (this.latest.get(p.kind) !== msg.id && (p.kind === 'analyze' || p.kind === 'series')) {
      p.reject(new Superseded('replaced by a newer request'));
      return;
    }
    if (msg.type === 'result') p.resolve(msg.result);
    else p.reject(new WorkerError(msg.message, msg.inputError));
  }
}

export function createAnalysisClient(): AnalysisClient {
  const worker = new Worker(new URL('./analysis.worker.ts', import.meta.url), { type: 'module', name: 'lagbench-analysis' });
  return new AnalysisClient(worker);
}
