/**
 * One bulletin's model file as it will be written: the text (stable-json.ts), its SHA-256 and its
 * listing. assemble-with-memo.ts makes these (composed now or taken from the model memo) and
 * write-model.ts writes them as they are; the type lives here so neither imports the other.
 */
import type { BulletinListing } from './listing.ts';

export interface WrittenBulletin {
  seasonId: string;
  segmentId: string;
  text: Buffer;
  /** SHA-256 of `text` */
  sha256: string;
  listing: BulletinListing;
  /** taken from the memo (true) or composed in this build */
  reused: boolean;
}
