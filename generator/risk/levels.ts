/**
 * The four-step level scale of Wrackline (our own names). A level is always printed with its
 * rank in words ("level 3 of 4") and drawn with a pattern, never by colour alone.
 */
import type { LevelId } from '../model/types.ts';

export interface LevelDefinition {
  id: LevelId;
  rank: 1 | 2 | 3 | 4;
  label: string;
}

export const levelScale: readonly LevelDefinition[] = [
  { id: 'scant', rank: 1, label: 'Scant' },
  { id: 'noticeable', rank: 2, label: 'Noticeable' },
  { id: 'marked', rank: 3, label: 'Marked' },
  { id: 'heavy', rank: 4, label: 'Heavy' },
];

export function levelDefinition(id: LevelId): LevelDefinition {
  const found = levelScale.find((level) => level.id === id);
  if (!found) throw new Error(`levelDefinition: unknown level ${String(id)}`);
  return found;
}

export function levelRank(id: LevelId): 1 | 2 | 3 | 4 {
  return levelDefinition(id).rank;
}

/** "Marked (level 3 of 4)" */
export function levelWords(id: LevelId): string {
  const level = levelDefinition(id);
  return `${level.label} (level ${level.rank} of 4)`;
}
