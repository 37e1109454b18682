// The page's side of the analysis worker: start (and restart, which cancels a running analysis), send, and the
// request/answer pairs for overview windows.

import type { FromWorker, ToWorker } from './protocol';
import type { SignalWindow } from './signal-store';

export interface WorkerClient {
  send(msg: ToWorker): void;
  /** stops the worker (and whatever it was doing) and starts a fresh one */
  restart(): void;
  fetchWindow(t0: number, t1: number, columns: number): Promise<SignalWindow>;
}

export function createWorkerClient(onMessage: (m: FromWorker) => void, onFail: (message: string) => void): WorkerClient {
  const waiters = new Map<number, (w: SignalWindow) => void>();
  let nextId = 0;
  const start = (): Worker => {
    const w = new Worker(new URL('./worker.ts', import.meta.url), { type: 'module' });
    w.onmessage = (ev: MessageEvent<FromWorker>) => {
      const m = ev.data;
      if (m.type === 'window') {
        const resolve = waiters.get(m.id);
        waiters.delete(m.id);
        resolve?.(m.data);
      } else onMessage(m);
    };
    w.onerror = (ev) => onFail(`the analysis worker stopped: ${ev.message || 'unknown error'}`);
    return w;
  };
  let worker = start();
  return {
    send: (msg) => worker.postMessage(msg),
    restart() {
      worker.terminate();
      waiters.clear();
      worker = start();
    },
    fetchWindow(t0, t1, columns) {
      const id = ++nextId;
      return new Promise((resolve) => {
        waiters.set(id, resolve);
        worker.postMessage({ type: 'window', id, t0, t1, columns } satisfies ToWorker);
      });
    },
  };
}
