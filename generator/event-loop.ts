/**
 * Giving other work a turn during long synchronous loops (many small files read or written one
 * after another): child processes' output keeps flowing and timers run. Call it every few items.
 */
export function giveTurn(): Promise<void> {
  return new Promise((resolve) => setImmediate(resolve));
}
