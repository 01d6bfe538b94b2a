/**
 * The words of a change report (compare-releases.ts), for the terminal. The HTML page
 * (review-page.ts) uses the same words.
 */
import type { ChangeReport, ClaimChange, LeftOutRecord, LevelChange } from './compare-releases.ts';

const directionWords: { [direction: string]: string } = {
  rising: 'going up',
  falling: 'going down',
  'no-clear-direction': 'no clear direction',
  'too-little-data': 'too little data',
};

export function directionWord(direction: string | null): string {
  return direction === null ? 'not measured' : (directionWords[direction] ?? direction);
}

export function levelLine(change: LevelChange): string {
  const to = `${change.toLabel} (level ${change.toRank} of 4, ${change.toSeason})`;
  if (change.fromRank === null) return `${change.name}: new, ${to}`;
  const way = change.toRank > change.fromRank ? 'UP' : 'DOWN';
  return `${change.name}: ${way} from ${change.fromLabel} (level ${change.fromRank}, ${change.fromSeason}) to ${to}`;
}

/** Which rules moved a level: the rules setting the new level, and those of the old level that no longer match. */
export function levelReasons(change: LevelChange): string[] {
  const lines = change.setBy.map((hit) => `set by rule ${hit.ruleId}: ${hit.text}`);
  for (const hit of change.noLongerMatching) lines.push(`no longer matches rule ${hit.ruleId} (${hit.level})`);
  if (change.setBy.length === 0) lines.push('no rule matches now: the lowest level');
  return lines;
}

export function claimLine(change: ClaimChange): string {
  const what = { appears: 'claim appears', disappears: 'claim disappears', reverses: 'claim reverses' }[change.kind];
  return `${change.name}, ${change.label.toLowerCase()}: ${what} (${directionWord(change.from)} → ${directionWord(change.to)})`;
}

export function recordLine(record: LeftOutRecord): string {
  const where = [record.file, record.row === null ? null : `row ${record.row}`, record.column === null ? null : `column ${record.column}`]
    .filter((part) => part !== null)
    .join(', ');
  // Reader messages usually start with their own place ("file row 3, column x: …"); keep them whole.
  if (record.message.startsWith(record.file)) return record.message;
  return `${where}${record.value === null ? '' : ` value ${JSON.stringify(record.value)}`}: ${record.message}`;
}

export interface ReviewHeading {
  candidate: string;
  onLine: string | null;
  candidateFolder: string;
}

function section(title: string, lines: string[], none: string, count = lines.length): string[] {
  return ['', `${title} (${count})`, ...(lines.length === 0 ? [`  ${none}`] : lines)];
}

export function reviewText(report: ChangeReport, heading: ReviewHeading): string {
  const out: string[] = [
    `Change report: candidate ${heading.candidate.slice(0, 20)} against ${heading.onLine === null ? 'nothing published yet' : `the release on line ${heading.onLine}`}`,
  ];
  const levels: string[] = [];
  for (const change of report.levelChanges) {
    levels.push(`  ${levelLine(change)}`);
    for (const reason of levelReasons(change)) levels.push(`      ${reason}`);
  }
  out.push(...section('Levels that change', levels, 'no level goes up or down', report.levelChanges.length));
  out.push(
    ...section(
      'Trend claims that change',
      report.claimChanges.map((change) => `  ${claimLine(change)}`),
      'no trend claim appears, disappears or reverses',
    ),
  );
  const sentences: string[] = [];
  let last = '';
  for (const change of report.sentenceChanges) {
    if (change.bulletin !== last) {
      sentences.push(`  ${change.bulletin}`);
      last = change.bulletin;
    }
    sentences.push(`    ${change.place}:`);
    sentences.push(`      old: ${change.old ?? '(none)'}`);
    sentences.push(`      new: ${change.new ?? '(none)'}`);
    if (change.numbers && change.numbers.length > 0) sentences.push(`      numbers moved beyond their rounding: ${change.numbers.map((n) => `${n.old} → ${n.new}`).join(', ')}`);
  }
  const sentenceCount = report.sentenceChanges.length;
  out.push('', `Sentences that change (${sentenceCount}, old beside new)`, ...(sentenceCount === 0 ? ['  no sentence changes'] : sentences));
  if (report.archivedChanged.length > 0) {
    out.push('', `Archived bulletins that change (${report.archivedChanged.length}; each needs a recorded correction)`, ...report.archivedChanged.map((id) => `  ${id}`));
  }
  if (report.leftOut === null) {
    out.push('', 'Records left out: not compared (a release does not list them in validation/left-out.json)');
  } else {
    const lines: string[] = [];
    for (const group of report.leftOut) {
      lines.push(`  ${group.cause}: ${group.newlyLeftOut.length} newly left out, ${group.takenBackIn.length} taken back in`);
      for (const record of group.newlyLeftOut) lines.push(`      left out: ${recordLine(record)}`);
      for (const record of group.takenBackIn) lines.push(`      taken back in: ${recordLine(record)}`);
    }
    const moved = report.leftOut.reduce((sum, group) => sum + group.newlyLeftOut.length + group.takenBackIn.length, 0);
    out.push(...section('Records newly left out or taken back in, by cause', lines, 'the same records are left out', moved));
  }
  out.push(
    ...section(
      'Pages added',
      report.pagesAdded.map((page) => `  + ${page}`),
      'none',
    ),
  );
  out.push(
    ...section(
      'Pages removed',
      report.pagesRemoved.map((page) => `  - ${page}`),
      'none',
    ),
  );
  return out.join('\n');
}
