/**
 * Step: render (memory handed back between the model and the pages).
 * Asks V8 for a full garbage collection now. Used once, between the statistics (which leave a
 * few hundred megabytes of garbage: the scenario, the model, the trend cache) and the pages
 * (when two Astro processes need the memory): V8 collects lazily, so without this the build's
 * own process keeps that memory through the whole pages phase. Where the runtime refuses, it
 * does nothing.
 */
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';

export function collectGarbageNow(): void {
  try {
    setFlagsFromString('--expose-gc');
    const gc = runInNewContext('gc') as unknown;
    if (typeof gc === 'function') (gc as () => void)();
  } catch {
    // not available: V8 collects in its own time
  }
}
