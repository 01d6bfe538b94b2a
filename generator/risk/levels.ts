/**
 * The four-step level scale of Wrackline (our own names). A level is always printed with its
 * rank in words ("level 3 of 4") and drawn with a pattern, never by colour alone.
 */
import type { LevelId } from '../model/types.ts';

export interface LevelDefinition {
  id: LevelId;
  rank: 0 | 1 | 2 | 3 | 4;
  label: string;
}

export const levelScale: readonly LevelDefinition[] = [
  { id: 'scant', rank: 1, label: 'Scant' },
  { id: 'noticeable', rank: 2, label: 'Noticeable' },
  { id: 'marked', rank: 3, label: 'Marked' },
  { id: 'heavy', rank: 4, label: 'Heavy' },
];

/**
 * No level: no survey in the last four seasons and no rule met by other evidence. Absence of
 * evidence is never read as the lowest level.
 */
export const levelNotSet: LevelDefinition = { id: 'not-set', rank: 0, label: 'Level not set' };

export function levelDefinition(id: LevelId): LevelDefinition {
  if (id === 'not-set') return levelNotSet;
  const found = levelScale.find((level) => level.id === id);
  if (!found) throw new Error(`levelDefinition: unknown level ${String(id)}`);
  return found;
}

export function levelRank(id: LevelId): 0 | 1 | 2 | 3 | 4 {
  return levelDefinition(id).rank;
}

/** "Marked (level 3 of 4)"; "Level not set" */
export function levelWords(id: LevelId): string {
  const level = levelDefinition(id);
  if (level.rank === 0) return level.label;
  return `${level.label} (level ${level.rank} of 4)`;
}
