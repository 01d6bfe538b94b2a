/**
 * A number per particle id, fast for the usual case of small whole-number ids (a growable typed
 * array indexed by id) with a Map for large ids. Used per position, millions of times, where a
 * Map alone was the main cost.
 */
// Ids below about a million use the array (at most 8 MB per table); larger ids use the Map.
const denseLimit = 1 << 20;

export class ParticleTable {
  private dense: Float64Array = new Float64Array(1024).fill(Number.NaN);
  private sparse: Map<number, number> | null = null;

  /** The value stored for a particle, or NaN when none. */
  get(particle: number): number {
    if (particle < denseLimit) return particle < this.dense.length ? (this.dense[particle] ?? Number.NaN) : Number.NaN;
    return this.sparse?.get(particle) ?? Number.NaN;
  }

  set(particle: number, value: number): void {
    if (particle < denseLimit) {
      if (particle >= this.dense.length) {
        let size = this.dense.length * 2;
        while (size <= particle) size *= 2;
        const grown = new Float64Array(Math.min(size, denseLimit)).fill(Number.NaN);
        grown.set(this.dense);
        this.dense = grown;
      }
      this.dense[particle] = value;
      return;
    }
    if (!this.sparse) this.sparse = new Map();
    this.sparse.set(particle, value);
  }
}
