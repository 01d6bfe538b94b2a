/**
 * Which of the publisher's notes (scenario settings) belong on a bulletin or a season's overview:
 * the season-wide ones first, then those about the one segment, each in the order of the
 * settings. A note is part of the bulletin model, so a note added to or changed on a past
 * season changes an archived bulletin and needs a recorded correction, like any other change.
 */
import type { PublisherNote } from './types.ts';

export interface NoteSetting {
  season: string;
  segment: string | null;
  text: string;
}

/** `segment` null: the season-wide notes only (the overview). */
export function notesFor(notes: readonly NoteSetting[], season: string, segment: string | null): PublisherNote[] {
  const forSeason = notes.filter((note) => note.season === season);
  return [
    ...forSeason.filter((note) => note.segment === null).map((note) => ({ scope: 'season' as const, text: note.text })),
    ...(segment === null ? [] : forSeason.filter((note) => note.segment === segment).map((note) => ({ scope: 'segment' as const, text: note.text }))),
  ];
}
