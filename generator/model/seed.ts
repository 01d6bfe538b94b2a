/**
 * Deterministic seeds for the bootstrap of each segment, indicator and season: the scenario's seed
 * combined with a 32-bit FNV-1a hash of "segment|indicator|season" (Fowler–Noll–Vo, FNV-1a:
 * offset basis 2166136261, prime 16777619). Same inputs, same seed, on every machine.
 */
export function fnv1a32(text: string): number {
  let hash = 2166136261;
  for (let i = 0; i < text.length; i += 1) {
    hash ^= text.charCodeAt(i);
    hash = Math.imul(hash, 16777619) >>> 0;
  }
  return hash >>> 0;
}

export function derivedSeed(baseSeed: number, ...parts: string[]): number {
  return (fnv1a32(parts.join('|')) ^ (baseSeed >>> 0)) >>> 0;
}
