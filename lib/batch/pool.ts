/**
 * A fixed pool of Deno Workers running the analysis of one file per job, sized to the machine.
 * Each job has a time budget, counted from when its worker is up (a fresh worker loads its
 * modules first, which on a busy machine can take seconds): a worker that runs past it, or
 * dies, is terminated and replaced, and only its file fails. A memory guard watches the process's resident size: past the cap,
 * the job running longest fails ("memory limit") and the others go on.
 *
 * Limitation (Deno 2.9): `Worker.terminate()` does not interrupt a worker busy in synchronous
 * code; a stopped worker runs on in the background until its job ends or the process exits.
 * The batch still finishes and writes its outputs, but a job that allocates without end can
 * exhaust the process before that: the size caps on what is read are the first defence.
 *
 * @module
 */
import type { SampleSettings } from "../analysis/sample_settings.ts";

/** What a job gives back. */
export type JobOutcome =
  | { ok: true; json: string; count: number }
  | { ok: false; error: { message: string; problem: string; line: number | null } };

interface Job {
  file: string;
  bytes: Uint8Array<ArrayBuffer>;
  settings: SampleSettings;
  resolve: (o: JobOutcome) => void;
}

interface Running extends Job {
  id: number;
  timer: ReturnType<typeof setTimeout> | undefined;
  /** When the job started, ms since the epoch. */
  startedAt: number;
}

interface Slot {
  worker: Worker;
  /** Whether the worker has said it is up (its modules loaded). */
  ready: boolean;
  job?: Running | undefined;
}

/** Longest a fresh worker may take to load its modules before its job fails, ms (our choice). */
const START_BUDGET_MS = 60_000;

/** How a pool runs its jobs. */
export interface PoolOptions {
  /** Longest a job may run before its worker is stopped, ms (default 60 s). */
  timeoutMs?: number;
  /** Resident size of the process past which the memory guard acts, bytes (default 3 GiB). */
  maxRssBytes?: number;
}

/** Default resident-size cap of a batch process, bytes. */
export const DEFAULT_MAX_RSS_BYTES = 3 * 1024 * 1024 * 1024;

/** A pool of workers; `run` queues a job and resolves with its outcome. */
export class WorkerPool {
  readonly size: number;
  readonly #timeoutMs: number;
  readonly #maxRss: number;
  #slots: Slot[] = [];
  #queue: Job[] = [];
  #nextId = 0;
  #closed = false;
  #guard: ReturnType<typeof setInterval> | undefined;
  /** The guard acts at most once per half second. */
  #nextTrip = 0;
  /** Workers replaced after a timeout, a crash or the memory guard. */
  replaced = 0;

  constructor(
    size = Math.max(1, Math.min(navigator.hardwareConcurrency || 2, 8)),
    options: PoolOptions = {},
  ) {
    this.size = size;
    this.#timeoutMs = options.timeoutMs ?? 60_000;
    this.#maxRss = options.maxRssBytes ?? DEFAULT_MAX_RSS_BYTES;
    for (let i = 0; i < size; i++) this.#slots.push(this.#spawn());
  }

  #spawn(): Slot {
    const slot: Slot = {
      worker: new Worker(new URL("./worker.ts", import.meta.url).href, { type: "module" }),
      ready: false,
    };
    slot.worker.onmessage = (e: MessageEvent<({ id: number } & JobOutcome) | { ready: true }>) => {
      if ("ready" in e.data) {
        slot.ready = true;
        if (slot.job) this.#arm(slot, this.#timeoutMs);
        return;
      }
      const job = slot.job;
      if (!job || job.id !== e.data.id) return;
      const { id: _id, ...outcome } = e.data;
      this.#end(slot, outcome as JobOutcome);
      this.#pump();
    };
    slot.worker.onerror = (e) => {
      e.preventDefault();
      this.#stop(slot, `worker failed: ${e.message}`);
    };
    slot.worker.onmessageerror = () => this.#stop(slot, "worker sent an unreadable result");
    return slot;
  }

  #end(slot: Slot, outcome: JobOutcome) {
    const job = slot.job!;
    clearTimeout(job.timer);
    slot.job = undefined;
    this.#updateGuard();
    job.resolve(outcome);
  }

  /** Replaces a slot's worker with a fresh one. */
  #replace(slot: Slot): void {
    slot.worker.terminate();
    const index = this.#slots.indexOf(slot);
    if (index < 0 || this.#closed) return;
    this.replaced++;
    this.#slots[index] = this.#spawn();
  }

  /** Stops a worker mid-job (its file fails) and carries on with a fresh one. */
  #stop(slot: Slot, message: string) {
    const job = slot.job;
    this.#replace(slot);
    if (job) {
      slot.job = job; // #end reads it
      this.#end(slot, {
        ok: false,
        error: { message: `${job.file}: ${message}`, problem: "processing", line: null },
      });
    }
    this.#pump();
  }

  /**
   * The memory guard: past the cap, the job running longest is stopped and fails (normal
   * files take milliseconds, so it is the one that keeps allocating); while the size stays
   * past the cap, the next longest follows, at most one every half second.
   */
  #checkMemory() {
    const rss = Deno.memoryUsage().rss;
    if (rss <= this.#maxRss || Date.now() < this.#nextTrip) return;
    const busy = this.#slots.filter((s) => s.job).sort((a, b) =>
      a.job!.startedAt - b.job!.startedAt
    );
    const oldest = busy[0];
    if (!oldest) return;
    this.#nextTrip = Date.now() + 500;
    const mb = (n: number) => `${Math.round(n / 1048576)} MB`;
    this.#stop(
      oldest,
      `memory limit: the batch passed ${mb(this.#maxRss)} (at ${
        mb(rss)
      }) while this file was analysed`,
    );
  }

  #updateGuard() {
    const busy = this.#slots.some((s) => s.job);
    if (busy && this.#guard === undefined && !this.#closed) {
      this.#guard = setInterval(() => this.#checkMemory(), 25);
    } else if (!busy && this.#guard !== undefined) {
      clearInterval(this.#guard);
      this.#guard = undefined;
    }
  }

  /** Starts queued jobs on idle workers. */
  #pump() {
    if (this.#closed) return;
    while (this.#queue.length > 0) {
      const next = this.#queue[0]!;
      const idle = this.#slots.find((s) => !s.job);
      if (!idle) return;
      this.#queue.shift();
      this.#start(idle, next);
    }
  }

  /** (Re)starts the running job's clock: the analysis budget, or the start-up budget. */
  #arm(slot: Slot, ms: number) {
    const job = slot.job!;
    clearTimeout(job.timer);
    job.startedAt = Date.now();
    job.timer = setTimeout(
      () =>
        this.#stop(
          slot,
          slot.ready
            ? `analysis took longer than ${this.#timeoutMs / 1000} s (stopped)`
            : `the worker did not start within ${ms / 1000} s`,
        ),
      ms,
    );
  }

  #start(slot: Slot, job: Job) {
    const id = this.#nextId++;
    slot.job = { ...job, id, timer: undefined, startedAt: Date.now() };
    this.#arm(slot, slot.ready ? this.#timeoutMs : Math.max(this.#timeoutMs, START_BUDGET_MS));
    this.#updateGuard();
    slot.worker.postMessage({ id, file: job.file, bytes: job.bytes, settings: job.settings }, [
      job.bytes.buffer,
    ]);
  }

  /** Number of jobs running or queued. */
  get inFlight(): number {
    return this.#slots.filter((s) => s.job).length + this.#queue.length;
  }

  /** Runs one job. */
  run(file: string, bytes: Uint8Array<ArrayBuffer>, settings: SampleSettings): Promise<JobOutcome> {
    return new Promise((resolve) => {
      this.#queue.push({ file, bytes, settings, resolve });
      this.#pump();
    });
  }

  /** Stops all workers. */
  close(): void {
    this.#closed = true;
    if (this.#guard !== undefined) clearInterval(this.#guard);
    for (const s of this.#slots) {
      if (s.job) clearTimeout(s.job.timer);
      s.worker.terminate();
    }
  }
}
