// A worker thread of trend-pool.ts: loads the TypeScript trend engine through tsx, then takes
// chunks of each batch it is sent until none are left, posting each chunk's outcomes (in order)
// on its results port and counting it in the shared array the calling thread waits on.
import { parentPort, workerData } from 'node:worker_threads';
import { tsImport } from 'tsx/esm/api';

const { analyzeOne } = await tsImport('./trend-pool.ts', import.meta.url);
const results = workerData.results;

parentPort.on('message', ({ job, requests, chunkSize, chunks, shared }) => {
  for (let chunk = Atomics.add(shared, 0, 1); chunk < chunks; chunk = Atomics.add(shared, 0, 1)) {
    const end = Math.min(requests.length, (chunk + 1) * chunkSize);
    const outcomes = [];
    for (let i = chunk * chunkSize; i < end; i++) outcomes.push(analyzeOne(requests[i]));
    results.postMessage({ job, chunk, outcomes });
    Atomics.add(shared, 1, 1);
    Atomics.notify(shared, 1);
  }
});
