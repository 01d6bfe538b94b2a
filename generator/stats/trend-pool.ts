/**
 * Many trend analyses at once, on every core: the calling thread and a pool of worker threads
 * (node:worker_threads) share one batch of analyzeTrend calls in chunks, and the results come
 * back in the order of the requests, whoever computed them. Synchronous for the caller, so the
 * model builder stays a plain function: the calling thread computes chunks itself, then waits for
 * the workers' chunks with Atomics.wait and reads their results with receiveMessageOnPort.
 *
 * Determinism: every analysis depends only on its own request (its series, options and bootstrap
 * seed), so the results are the same numbers whichever thread ran them; structured cloning
 * carries doubles exactly. test/stats/trend-pool.test.ts checks byte-identical output against
 * the one-thread path.
 *
 * Safety net: a worker that fails to start or stops answering only costs time: chunks that have
 * not come back after `stallMs` are computed by the calling thread.
 *
 * @example
 *   const outcomes = analyzeInPool(requests); // [{ result }, { error }, …] in request order
 */
import { availableParallelism } from 'node:os';
import { MessageChannel, receiveMessageOnPort, Worker, type MessagePort } from 'node:worker_threads';
import { analyzeTrend, type AnalyzeTrendOptions } from './analyze-trend.ts';
import type { SeriesPoint, TrendResult } from './types.ts';

export interface TrendRequest {
  points: readonly SeriesPoint[];
  options: AnalyzeTrendOptions;
}

/** The result of one request, or the message of the error it raised. */
export type TrendOutcome = { result: TrendResult } | { error: string };

/** Batches smaller than this run on the calling thread alone (starting workers costs ~1 s). */
export const POOL_MIN_BATCH = 2000;

/** One request, its error caught. */
export function analyzeOne(request: TrendRequest): TrendOutcome {
  try {
    return { result: analyzeTrend(request.points, request.options) };
  } catch (error) {
    return { error: error instanceof Error ? error.message : String(error) };
  }
}

/** Every request on the calling thread, in order. */
export function analyzeInOrder(requests: readonly TrendRequest[]): TrendOutcome[] {
  return requests.map(analyzeOne);
}

interface PoolWorker {
  worker: Worker;
  results: MessagePort;
}

let pool: PoolWorker[] | null = null;
let nextJob = 1;
let idleTimer: ReturnType<typeof setTimeout> | null = null;

/** Stop the workers once the caller's synchronous work is over (their memory is not kept for later phases). */
function stopPoolWhenIdle(): void {
  if (idleTimer) clearTimeout(idleTimer);
  // A timer cannot fire while the caller runs synchronously (e.g. the model build evaluating one
  // season after the other), so the pool lives through the whole build step and stops after it.
  idleTimer = setTimeout(() => {
    idleTimer = null;
    const stopping = pool ?? [];
    pool = null;
    for (const { worker, results } of stopping) {
      results.close();
      void worker.terminate();
    }
  }, 1000);
  idleTimer.unref();
}

function startPool(size: number): PoolWorker[] {
  const workers: PoolWorker[] = [];
  for (let i = 0; i < size; i++) {
    const channel = new MessageChannel();
    const worker = new Worker(new URL('./trend-pool-worker.mjs', import.meta.url), {
      workerData: { results: channel.port2 },
      transferList: [channel.port2],
    });
    // never keep the process alive, never crash it: a dead worker's chunks are recomputed here
    worker.unref();
    worker.on('error', () => undefined);
    channel.port1.unref();
    workers.push({ worker, results: channel.port1 });
  }
  return workers;
}

/**
 * Number of worker threads by default: one less than the cores, at least one, at most three; the
 * environment variable WRACKLINE_TREND_WORKERS overrides it (0 = the calling thread alone, which
 * also saves the memory of the workers).
 */
export function defaultWorkerCount(): number {
  const chosen = Number.parseInt(process.env['WRACKLINE_TREND_WORKERS'] ?? '', 10);
  if (Number.isInteger(chosen) && chosen >= 0) return Math.min(chosen, 8);
  return Math.min(3, Math.max(1, availableParallelism() - 1));
}

export interface PoolOptions {
  /** worker threads besides the calling thread; defaults to defaultWorkerCount() */
  workers?: number;
  /** requests per chunk; defaults to 16 */
  chunkSize?: number;
  /** run on the calling thread alone below this many requests; defaults to POOL_MIN_BATCH */
  minBatch?: number;
  /** recompute chunks a worker has not returned after this long without progress; defaults to 60 s */
  stallMs?: number;
  /** false: the calling thread only waits (for tests, so the workers compute everything) */
  callerComputes?: boolean;
}

/** Chunks computed by the calling thread and by workers in the latest pooled batch. */
export const lastBatchShares = { caller: 0, workers: 0 };

interface ChunkMessage {
  job: number;
  chunk: number;
  outcomes: TrendOutcome[];
}

/**
 * Analyse every request, on the calling thread and the worker pool; outcomes in request order.
 * Small batches (below `minBatch`) run on the calling thread alone.
 */
export function analyzeInPool(requests: readonly TrendRequest[], options: PoolOptions = {}): TrendOutcome[] {
  const minBatch = options.minBatch ?? POOL_MIN_BATCH;
  const workerCount = options.workers ?? defaultWorkerCount();
  if (requests.length < minBatch || workerCount < 1 || requests.length === 0) return analyzeInOrder(requests);
  if (!pool || pool.length < workerCount) pool = [...(pool ?? []), ...startPool(workerCount - (pool?.length ?? 0))];
  const members = pool.slice(0, workerCount);
  const chunkSize = Math.max(1, options.chunkSize ?? 16);
  const stallMs = options.stallMs ?? 60_000;
  const chunks = Math.ceil(requests.length / chunkSize);
  // [0] next chunk to claim, [1] chunks finished by workers (to wait on)
  const shared = new Int32Array(new SharedArrayBuffer(8));
  const job = nextJob++;
  for (const { worker } of members) worker.postMessage({ job, requests, chunkSize, chunks, shared });

  const outcomes: TrendOutcome[] = new Array<TrendOutcome>(requests.length);
  const done = new Uint8Array(chunks);
  let doneCount = 0;
  const computeChunk = (chunk: number): void => {
    const end = Math.min(requests.length, (chunk + 1) * chunkSize);
    for (let i = chunk * chunkSize; i < end; i++) outcomes[i] = analyzeOne(requests[i] as TrendRequest);
    done[chunk] = 1;
    doneCount++;
  };
  const drain = (): void => {
    for (const { results } of members) {
      for (let message = receiveMessageOnPort(results); message; message = receiveMessageOnPort(results)) {
        const { job: of, chunk, outcomes: part } = message.message as ChunkMessage;
        if (of !== job || done[chunk]) continue;
        part.forEach((outcome, k) => (outcomes[chunk * chunkSize + k] = outcome));
        done[chunk] = 1;
        doneCount++;
      }
    }
  };

  let byCaller = 0;
  if (options.callerComputes !== false) {
    for (let chunk = Atomics.add(shared, 0, 1); chunk < chunks; chunk = Atomics.add(shared, 0, 1), byCaller++) computeChunk(chunk);
  }
  let waited = 0;
  while (doneCount < chunks) {
    const seen = Atomics.load(shared, 1);
    drain();
    if (doneCount >= chunks) break;
    if (Atomics.wait(shared, 1, seen, 50) === 'timed-out') {
      waited += 50;
      if (waited >= stallMs) {
        for (let chunk = 0; chunk < chunks; chunk++) if (!done[chunk]) computeChunk(chunk), byCaller++;
      }
    } else waited = 0;
  }
  stopPoolWhenIdle();
  lastBatchShares.caller = byCaller;
  lastBatchShares.workers = chunks - byCaller;
  return outcomes;
}
