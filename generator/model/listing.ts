/**
 * The few fields of a bulletin that pages listing many bulletins read (overview, season pages,
 * archive, feed, place list), written beside the bulletins as `listing/<season>.json`, so
 * those pages never read every bulletin in full; each bulletin page reads its own file.
 */
import type { Bulletin, LevelResult, SeasonRef, SegmentInfo } from './types.ts';

export interface BulletinListing {
  invented: boolean;
  season: SeasonRef;
  published: string;
  correction: Bulletin['correction'];
  segment: Pick<SegmentInfo, 'id' | 'name' | 'kind' | 'place'>;
  level: Pick<LevelResult, 'id' | 'rank' | 'label'>;
  headline: string;
  /** whether the bulletin carries shellfish and debris cautions */
  cautions: { shellfish: boolean; debris: boolean };
}

export function listingOf(bulletin: Bulletin): BulletinListing {
  return {
    invented: bulletin.invented,
    season: { id: bulletin.season.id, label: bulletin.season.label, start: bulletin.season.start, end: bulletin.season.end },
    published: bulletin.published,
    correction: bulletin.correction,
    segment: { id: bulletin.segment.id, name: bulletin.segment.name, kind: bulletin.segment.kind, place: bulletin.segment.place },
    level: { id: bulletin.level.id, rank: bulletin.level.rank, label: bulletin.level.label },
    headline: bulletin.headline,
    cautions: { shellfish: bulletin.cautions.shellfish.length > 0, debris: bulletin.cautions.debris.length > 0 },
  };
}
