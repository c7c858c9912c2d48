/**
 * A fixed pool of Deno Workers running the analysis of one file per job, sized to the machine.
 * Each job has a time budget: a worker that runs past it, or dies, is terminated and replaced,
 * and only its file fails.
 *
 * @module
 */
import type { SampleSettings } from "../analysis/sample_settings.ts";

/** What a job gives back. */
export type JobOutcome =
  | { ok: true; json: string; count: number }
  | { ok: false; error: { message: string; problem: string; line: number | null } };

interface Slot {
  worker: Worker;
  job?: {
    id: number;
    file: string;
    resolve: (o: JobOutcome) => void;
    timer: ReturnType<typeof setTimeout>;
  } | undefined;
}

/** How a pool runs its jobs. */
export interface PoolOptions {
  /** Longest a job may run before its worker is stopped, ms (default 60 s). */
  timeoutMs?: number;
}

/** A pool of workers; `run` queues a job and resolves with its outcome. */
export class WorkerPool {
  readonly size: number;
  readonly #timeoutMs: number;
  #slots: Slot[] = [];
  #queue: ((slot: Slot) => void)[] = [];
  #nextId = 0;
  #closed = false;
  /** Workers replaced after a timeout or a crash. */
  replaced = 0;

  constructor(
    size = Math.max(1, Math.min(navigator.hardwareConcurrency || 2, 8)),
    options: PoolOptions = {},
  ) {
    this.size = size;
    this.#timeoutMs = options.timeoutMs ?? 60_000;
    for (let i = 0; i < size; i++) this.#slots.push(this.#spawn());
  }

  #spawn(): Slot {
    const slot: Slot = {
      worker: new Worker(new URL("./worker.ts", import.meta.url).href, { type: "module" }),
    };
    slot.worker.onmessage = (e: MessageEvent<{ id: number } & JobOutcome>) => {
      const job = slot.job;
      if (!job || job.id !== e.data.id) return;
      const { id: _id, ...outcome } = e.data;
      this.#finish(slot, outcome as JobOutcome);
    };
    slot.worker.onerror = (e) => {
      e.preventDefault();
      this.#fail(slot, `worker failed: ${e.message}`);
    };
    slot.worker.onmessageerror = () => this.#fail(slot, "worker sent an unreadable result");
    return slot;
  }

  #finish(slot: Slot, outcome: JobOutcome) {
    const job = slot.job!;
    clearTimeout(job.timer);
    slot.job = undefined;
    job.resolve(outcome);
    this.#next(slot);
  }

  /** Stops a worker mid-job and puts a fresh one in its place. */
  #fail(slot: Slot, message: string) {
    const job = slot.job;
    slot.worker.terminate();
    const index = this.#slots.indexOf(slot);
    if (job) {
      clearTimeout(job.timer);
      job.resolve({
        ok: false,
        error: { message: `${job.file}: ${message}`, problem: "processing", line: null },
      });
    }
    if (index < 0 || this.#closed) return;
    this.replaced++;
    const fresh = this.#spawn();
    this.#slots[index] = fresh;
    this.#next(fresh);
  }

  #next(slot: Slot) {
    if (this.#closed) return;
    this.#queue.shift()?.(slot);
  }

  /** Number of jobs running or queued. */
  get inFlight(): number {
    return this.#slots.filter((s) => s.job).length + this.#queue.length;
  }

  /** Runs one job; the bytes are transferred to the worker. */
  run(file: string, bytes: Uint8Array<ArrayBuffer>, settings: SampleSettings): Promise<JobOutcome> {
    return new Promise((resolve) => {
      const start = (slot: Slot) => {
        const id = this.#nextId++;
        const timer = setTimeout(
          () => this.#fail(slot, `analysis took longer than ${this.#timeoutMs / 1000} s (stopped)`),
          this.#timeoutMs,
        );
        slot.job = { id, file, resolve, timer };
        slot.worker.postMessage({ id, file, bytes, settings }, [bytes.buffer]);
      };
      const idle = this.#slots.find((s) => !s.job);
      if (idle) start(idle);
      else this.#queue.push(start);
    });
  }

  /** Stops all workers. */
  close(): void {
    this.#closed = true;
    for (const s of this.#slots) {
      if (s.job) clearTimeout(s.job.timer);
      s.worker.terminate();
    }
  }
}
