/**
 * What a candidate release changes for readers, against the release on line: a pure comparison
 * of the two releases' bulletin models (their `bulletin.json` downloads), their lists of records
 * left out (`validation/left-out.json`) and their page lists (manifest). Used by `wrackline
 * review`; the words of the report are in review-text.ts and review-page.ts.
 *
 * Per segment, the bulletin a reader meets at `/segments/<segment>/` (the segment's latest
 * season) on line is compared with the candidate's; a bulletin of the same season and segment
 * in both releases (an archived page) is compared too, since it may only change through a
 * recorded correction.
 */
import type { Bulletin, Direction, LevelResult, RuleHit } from '../model/types.ts';

/** A record left out of the bulletins, as the data checks list it. */
export interface LeftOutRecord {
  file: string;
  row: number | null;
  column: string | null;
  value: string | null;
  message: string;
  expected: string;
  code?: string;
}

export interface ReleaseContent {
  /** Every bulletin of the release by "season/segment". */
  bulletins: Map<string, Bulletin>;
  /** Site-relative page paths ("seasons/2026-autumn/x/index.html") of the release. */
  pages: string[];
  /** Records left out; null when the release does not list them. */
  leftOut: LeftOutRecord[] | null;
}

export interface LevelChange {
  segment: string;
  name: string;
  from: LevelResult['id'] | null;
  fromRank: number | null;
  fromLabel: string | null;
  to: LevelResult['id'];
  toRank: number;
  toLabel: string;
  fromSeason: string | null;
  toSeason: string;
  /** Rules that set the new level (the highest matching ones). */
  setBy: RuleHit[];
  /** Rules of the old level that no longer match. */
  noLongerMatching: RuleHit[];
}

export type ClaimChangeKind = 'appears' | 'disappears' | 'reverses';

export interface ClaimChange {
  segment: string;
  name: string;
  indicator: string;
  label: string;
  kind: ClaimChangeKind;
  from: Direction | null;
  to: Direction | null;
}

export interface SentenceChange {
  /** "season/segment" of the new bulletin (or the old one, when a sentence was removed). */
  bulletin: string;
  /** Where in the bulletin: "headline", "summary 2", "beach-litter 3", "visitors 1", … */
  place: string;
  old: string | null;
  new: string | null;
  /** Printed numbers that moved ("83 → 86"), when only numbers differ. */
  numbers: { old: string; new: string }[] | null;
}

export interface LeftOutGroup {
  cause: string;
  newlyLeftOut: LeftOutRecord[];
  takenBackIn: LeftOutRecord[];
}

export interface ChangeReport {
  levelChanges: LevelChange[];
  claimChanges: ClaimChange[];
  sentenceChanges: SentenceChange[];
  /** null when either release does not list its records left out. */
  leftOut: LeftOutGroup[] | null;
  pagesAdded: string[];
  pagesRemoved: string[];
  /** Archived bulletins (same season and segment in both) whose model differs. */
  archivedChanged: string[];
  segmentsAdded: string[];
  segmentsRemoved: string[];
}

const claims: ReadonlySet<Direction> = new Set(['rising', 'falling']);

function compareText(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/** Each segment's latest bulletin (by season start). */
export function latestBySegment(bulletins: ReadonlyMap<string, Bulletin>): Map<string, Bulletin> {
  const latest = new Map<string, Bulletin>();
  for (const bulletin of bulletins.values()) {
    const held = latest.get(bulletin.segment.id);
    if (!held || held.season.start < bulletin.season.start) latest.set(bulletin.segment.id, bulletin);
  }
  return latest;
}

export function levelChange(old: Bulletin | null, next: Bulletin): LevelChange | null {
  if (old !== null && old.level.rank === next.level.rank) return null;
  const setBy = next.level.hits.filter((hit) => hit.level === next.level.id);
  const nowMatching = new Set(next.level.hits.map((hit) => hit.ruleId));
  const noLongerMatching = old === null ? [] : old.level.hits.filter((hit) => hit.level === old.level.id && !nowMatching.has(hit.ruleId));
  return {
    segment: next.segment.id,
    name: next.segment.name,
    from: old?.level.id ?? null,
    fromRank: old?.level.rank ?? null,
    fromLabel: old?.level.label ?? null,
    to: next.level.id,
    toRank: next.level.rank,
    toLabel: next.level.label,
    fromSeason: old?.season.id ?? null,
    toSeason: next.season.id,
    setBy,
    noLongerMatching,
  };
}

export function claimChanges(old: Bulletin | null, next: Bulletin): ClaimChange[] {
  const before = new Map((old?.indicators ?? []).map((indicator) => [indicator.indicator, indicator]));
  const after = new Map(next.indicators.map((indicator) => [indicator.indicator, indicator]));
  const ids = [...new Set([...before.keys(), ...after.keys()])].sort(compareText);
  const changes: ClaimChange[] = [];
  for (const id of ids) {
    const from = before.get(id)?.direction ?? null;
    const to = after.get(id)?.direction ?? null;
    const wasClaim = from !== null && claims.has(from);
    const isClaim = to !== null && claims.has(to);
    let kind: ClaimChangeKind | null = null;
    if (!wasClaim && isClaim) kind = 'appears';
    else if (wasClaim && !isClaim) kind = 'disappears';
    else if (wasClaim && isClaim && from !== to) kind = 'reverses';
    if (kind === null) continue;
    const label = after.get(id)?.label ?? before.get(id)?.label ?? id;
    changes.push({ segment: next.segment.id, name: next.segment.name, indicator: id, label, kind, from, to });
  }
  return changes;
}

/**
 * The sentences a reader meets in a bulletin, by part: each part is a list in reading order
 * ("summary", "since last season", one per indicator, …); key numbers are one part per label.
 */
export function sentencesOf(bulletin: Bulletin): Map<string, string[]> {
  const out = new Map<string, string[]>();
  out.set('headline', [bulletin.headline]);
  if (bulletin.notes && bulletin.notes.length > 0)
    out.set(
      'note from the publisher',
      bulletin.notes.map((note) => note.text),
    );
  out.set('summary', bulletin.summary);
  out.set('since last season', bulletin.changes);
  for (const indicator of bulletin.indicators) out.set(indicator.indicator, indicator.sentences);
  if (bulletin.sections.growers) out.set('growers', bulletin.sections.growers.sentences);
  out.set('visitors', bulletin.sections.visitors.sentences);
  for (const entry of bulletin.sections.reporters.keyNumbers) out.set(`key number: ${entry.label}`, [entry.value]);
  if (bulletin.correction) out.set('correction', [`${bulletin.correction.date}: ${bulletin.correction.reason}`]);
  return out;
}

/**
 * Old and new sentences of one part, paired: sentences in both stay unpaired (unchanged) by a
 * longest common subsequence; between two unchanged ones, removed and added sentences are put
 * side by side in order, the rest stand alone.
 */
export function pairSentences(old: readonly string[], next: readonly string[]): { old: string | null; new: string | null }[] {
  const n = old.length;
  const m = next.length;
  const table: number[][] = Array.from({ length: n + 1 }, () => new Array<number>(m + 1).fill(0));
  for (let i = n - 1; i >= 0; i -= 1) {
    for (let j = m - 1; j >= 0; j -= 1) {
      table[i]![j] = old[i] === next[j] ? table[i + 1]![j + 1]! + 1 : Math.max(table[i + 1]![j]!, table[i]![j + 1]!);
    }
  }
  const pairs: { old: string | null; new: string | null }[] = [];
  let removed: string[] = [];
  let added: string[] = [];
  const flush = (): void => {
    for (let k = 0; k < Math.max(removed.length, added.length); k += 1) pairs.push({ old: removed[k] ?? null, new: added[k] ?? null });
    removed = [];
    added = [];
  };
  let i = 0;
  let j = 0;
  while (i < n || j < m) {
    if (i < n && j < m && old[i] === next[j]) {
      flush();
      i += 1;
      j += 1;
    } else if (j < m && (i >= n || table[i]![j + 1]! >= table[i + 1]![j]!)) {
      added.push(next[j]!);
      j += 1;
    } else {
      removed.push(old[i]!);
      i += 1;
    }
  }
  flush();
  return pairs;
}

const numberPattern = /[+−-]?\d[\d,]*(?:\.\d+)?/g;

/**
 * The printed numbers that differ between two sentences, when the sentences are the same apart
 * from them; null when the words differ too. The numbers are compared as printed, that is after
 * rounding: two values that round alike print alike and never show up here.
 */
export function movedNumbers(old: string, next: string): { old: string; new: string }[] | null {
  if (old.replace(numberPattern, '#') !== next.replace(numberPattern, '#')) return null;
  const before = old.match(numberPattern) ?? [];
  const after = next.match(numberPattern) ?? [];
  const moved: { old: string; new: string }[] = [];
  before.forEach((value, i) => {
    const other = after[i];
    if (other !== undefined && other !== value) moved.push({ old: value, new: other });
  });
  return moved;
}

export function sentenceChanges(old: Bulletin | null, next: Bulletin | null): SentenceChange[] {
  const before = old ? sentencesOf(old) : new Map<string, string[]>();
  const after = next ? sentencesOf(next) : new Map<string, string[]>();
  const bulletin = next ?? old;
  if (!bulletin) return [];
  const id = `${bulletin.season.id}/${bulletin.segment.id}`;
  const places = [...before.keys(), ...[...after.keys()].filter((key) => !before.has(key))];
  const changes: SentenceChange[] = [];
  for (const place of places) {
    for (const pair of pairSentences(before.get(place) ?? [], after.get(place) ?? [])) {
      changes.push({ bulletin: id, place, old: pair.old, new: pair.new, numbers: pair.old !== null && pair.new !== null ? movedNumbers(pair.old, pair.new) : null });
    }
  }
  return changes;
}

function recordKey(record: LeftOutRecord): string {
  return [record.file, record.row ?? '', record.column ?? '', record.code ?? record.message].join('\u0000');
}

/** The cause a record was left out for: its catalogue code, else what was expected. */
function causeOf(record: LeftOutRecord): string {
  return record.code ?? record.expected;
}

export function leftOutChanges(old: readonly LeftOutRecord[], next: readonly LeftOutRecord[]): LeftOutGroup[] {
  const before = new Set(old.map(recordKey));
  const after = new Set(next.map(recordKey));
  const groups = new Map<string, LeftOutGroup>();
  const group = (cause: string): LeftOutGroup => {
    let found = groups.get(cause);
    if (!found) {
      found = { cause, newlyLeftOut: [], takenBackIn: [] };
      groups.set(cause, found);
    }
    return found;
  };
  for (const record of next) if (!before.has(recordKey(record))) group(causeOf(record)).newlyLeftOut.push(record);
  for (const record of old) if (!after.has(recordKey(record))) group(causeOf(record)).takenBackIn.push(record);
  return [...groups.values()].sort((a, b) => compareText(a.cause, b.cause));
}

/** "seasons/x/y/index.html" → "/seasons/x/y/"; other files keep their path. */
export function pageUrl(file: string): string {
  if (file === 'index.html') return '/';
  if (file.endsWith('/index.html')) return `/${file.slice(0, -'index.html'.length)}`;
  return `/${file}`;
}

const isPage = (file: string): boolean => file.endsWith('.html') || file.endsWith('.xml');

export function compareReleases(online: ReleaseContent, candidate: ReleaseContent): ChangeReport {
  const oldLatest = latestBySegment(online.bulletins);
  const newLatest = latestBySegment(candidate.bulletins);
  const segments = [...newLatest.keys()].sort(compareText);
  const levelChanges: LevelChange[] = [];
  const claimList: ClaimChange[] = [];
  const sentences: SentenceChange[] = [];
  for (const segment of segments) {
    const next = newLatest.get(segment);
    if (!next) continue;
    const old = oldLatest.get(segment) ?? null;
    const level = levelChange(old, next);
    if (level) levelChanges.push(level);
    claimList.push(...claimChanges(old, next));
    sentences.push(...sentenceChanges(old, next));
  }
  // Archived bulletins: the same season and segment in both releases.
  const archivedChanged: string[] = [];
  for (const [id, next] of [...candidate.bulletins].sort((a, b) => compareText(a[0], b[0]))) {
    const old = online.bulletins.get(id);
    if (!old || JSON.stringify(old) === JSON.stringify(next)) continue;
    archivedChanged.push(id);
    const current = newLatest.get(next.segment.id);
    // the current bulletin's sentences were compared above (against the latest on line)
    if (current !== next || oldLatest.get(next.segment.id) !== old) sentences.push(...sentenceChanges(old, next));
  }
  const oldPages = new Set(online.pages.filter(isPage));
  const newPages = new Set(candidate.pages.filter(isPage));
  return {
    levelChanges,
    claimChanges: claimList,
    sentenceChanges: sentences,
    leftOut: online.leftOut === null || candidate.leftOut === null ? null : leftOutChanges(online.leftOut, candidate.leftOut),
    pagesAdded: [...newPages]
      .filter((file) => !oldPages.has(file))
      .sort(compareText)
      .map(pageUrl),
    pagesRemoved: [...oldPages]
      .filter((file) => !newPages.has(file))
      .sort(compareText)
      .map(pageUrl),
    archivedChanged,
    segmentsAdded: segments.filter((segment) => !oldLatest.has(segment)),
    segmentsRemoved: [...oldLatest.keys()].filter((segment) => !newLatest.has(segment)).sort(compareText),
  };
}
