/**
 * Step: swap (removing work folders and retired releases).
 * Deleting large folder trees on a worker thread. A recursive delete through fs/promises sends
 * every unlink through libuv's small thread pool, and while tens of thousands of them wait there,
 * every other file call of the build waits behind them. On a thread of its own, with
 * synchronous calls, the delete takes nothing from the build's pool.
 */
import { Worker } from 'node:worker_threads';

const remover = `
const { rmSync } = require('node:fs');
const { workerData } = require('node:worker_threads');
for (const folder of workerData) {
  try {
    rmSync(folder, { recursive: true, force: true, maxRetries: 3 });
  } catch {
    // left for the next build, which tries again
  }
}
`;

/** Deletes each folder (recursively); resolves when all are gone or could not be deleted. Never rejects. */
export function removeInWorker(folders: readonly string[]): Promise<void> {
  if (folders.length === 0) return Promise.resolve();
  return new Promise((resolve) => {
    const worker = new Worker(remover, { eval: true, workerData: [...folders] });
    worker.once('error', () => resolve());
    worker.once('exit', () => resolve());
  });
}
