/**
 * A fixed pool of Deno Workers running the analysis of one file per job, sized to the machine.
 *
 * @module
 */
import type { SampleResult } from "../analysis/sample_result.ts";
import type { SampleSettings } from "../analysis/sample_settings.ts";

/** What a job gives back. */
export type JobOutcome =
  | { ok: true; results: SampleResult[] }
  | { ok: false; error: { message: string; problem: string; line: number | null } };

interface Pending {
  resolve: (o: JobOutcome) => void;
  worker: Worker;
}

/** A pool of workers; `run` queues a job and resolves with its outcome. */
export class WorkerPool {
  readonly size: number;
  #workers: Worker[] = [];
  #idle: Worker[] = [];
  #queue: (() => void)[] = [];
  #pending = new Map<number, Pending>();
  #nextId = 0;

  constructor(size = Math.max(1, Math.min(navigator.hardwareConcurrency || 2, 8))) {
    this.size = size;
    for (let i = 0; i < size; i++) {
      const w = new Worker(new URL("./worker.ts", import.meta.url).href, { type: "module" });
      w.onmessage = (e: MessageEvent<{ id: number } & JobOutcome>) => {
        const p = this.#pending.get(e.data.id);
        if (!p) return;
        this.#pending.delete(e.data.id);
        this.#release(p.worker);
        const { id: _id, ...outcome } = e.data;
        p.resolve(outcome as JobOutcome);
      };
      w.onerror = (e) => {
        e.preventDefault();
        for (const [id, p] of this.#pending) {
          if (p.worker !== w) continue;
          this.#pending.delete(id);
          p.resolve({
            ok: false,
            error: { message: `Worker failed: ${e.message}`, problem: "processing", line: null },
          });
          this.#release(w);
        }
      };
      this.#workers.push(w);
      this.#idle.push(w);
    }
  }

  #release(w: Worker) {
    this.#idle.push(w);
    this.#queue.shift()?.();
  }

  /** Number of jobs sent and not yet answered. */
  get inFlight(): number {
    return this.#pending.size + this.#queue.length;
  }

  /** Runs one job; the bytes are transferred to the worker. */
  run(file: string, bytes: Uint8Array<ArrayBuffer>, settings: SampleSettings): Promise<JobOutcome> {
    return new Promise((resolve) => {
      const start = () => {
        const worker = this.#idle.pop()!;
        const id = this.#nextId++;
        this.#pending.set(id, { resolve, worker });
        worker.postMessage({ id, file, bytes, settings }, [bytes.buffer]);
      };
      if (this.#idle.length > 0) start();
      else this.#queue.push(start);
    });
  }

  /** Stops all workers. */
  close(): void {
    for (const w of this.#workers) w.terminate();
  }
}
