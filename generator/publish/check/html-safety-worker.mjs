// Step: check (page safety, before the swap).
// A worker thread of html-safety.ts: loads the TypeScript checks through tsx, checks the pages
// it is given (paths relative to the site folder) and posts their problems back.
import { parentPort, workerData } from 'node:worker_threads';
import { tsImport } from 'tsx/esm/api';

const { siteProblems } = await tsImport('./html-safety.ts', import.meta.url);
parentPort.postMessage(await siteProblems(workerData.root, workerData.files));
