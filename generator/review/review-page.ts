/**
 * The change report as one private HTML page for the people who sign a release off. It is
 * written into the publishing state folder (candidate.ts), never into a release, so it is never
 * on line. One self-contained file: no script, no outside resource (its policy forbids both),
 * every text escaped. Same words as the terminal report (review-text.ts).
 */
import type { ChangeReport } from './compare-releases.ts';
import { claimLine, levelLine, levelReasons, recordLine } from './review-text.ts';
import type { ReviewHeading } from './review-text.ts';

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);
}

const style = `
body{font:16px/1.45 system-ui,sans-serif;margin:0 auto;max-width:72rem;padding:1rem;color:#1b1b1b}
.private{background:#fff3c4;border:2px solid #8a6d00;padding:.6rem 1rem;font-weight:600}
h1{font-size:1.5rem}h2{font-size:1.2rem;margin-top:2rem;border-bottom:1px solid #999}
table{border-collapse:collapse;width:100%}th,td{border:1px solid #bbb;padding:.35rem .5rem;vertical-align:top;text-align:left}
td.old{background:#fde8e8}td.new{background:#e6f4ea}.up{color:#8a1c1c;font-weight:600}.down{color:#1c5a2a;font-weight:600}
.moved{font-size:.9em;color:#444}code{font-size:.9em;overflow-wrap:anywhere}ul.rules{margin:.2rem 0;padding-left:1.2rem}
@media (max-width:40rem){table,tbody,tr,td,th{display:block}thead{display:none}tr{margin-bottom:.6rem}
td.old::before{content:"Old: ";font-weight:600}td.new::before{content:"New: ";font-weight:600}}`;

function list(items: string[], none: string): string {
  return items.length === 0 ? `<p>${escapeHtml(none)}</p>` : `<ul>${items.map((item) => `<li>${item}</li>`).join('')}</ul>`;
}

export function reviewPage(report: ChangeReport, heading: ReviewHeading): string {
  const e = escapeHtml;
  const levelRows = report.levelChanges.map((change) => {
    const way = change.fromRank === null ? '' : change.toRank > change.fromRank ? 'up' : 'down';
    return `<tr><td class="${way}">${e(levelLine(change))}</td><td><ul class="rules">${levelReasons(change)
      .map((r) => `<li>${e(r)}</li>`)
      .join('')}</ul></td></tr>`;
  });
  const sentenceRows = report.sentenceChanges.map(
    (change) =>
      `<tr><td><code>${e(change.bulletin)}</code><br>${e(change.place)}</td><td class="old">${e(change.old ?? '(none)')}</td><td class="new">${e(change.new ?? '(none)')}` +
      `${change.numbers && change.numbers.length > 0 ? `<div class="moved">numbers moved beyond their rounding: ${e(change.numbers.map((n) => `${n.old} → ${n.new}`).join(', '))}</div>` : ''}</td></tr>`,
  );
  let leftOut: string;
  if (report.leftOut === null) {
    leftOut = '<p>Not compared: a release does not list its records left out (validation/left-out.json).</p>';
  } else if (report.leftOut.length === 0) {
    leftOut = '<p>The same records are left out.</p>';
  } else {
    leftOut = report.leftOut
      .map(
        (group) =>
          `<h3><code>${e(group.cause)}</code>: ${group.newlyLeftOut.length} newly left out, ${group.takenBackIn.length} taken back in</h3>` +
          list([...group.newlyLeftOut.map((r) => `left out: ${e(recordLine(r))}`), ...group.takenBackIn.map((r) => `taken back in: ${e(recordLine(r))}`)], ''),
      )
      .join('');
  }
  return [
    '<!doctype html>',
    '<html lang="en"><head><meta charset="utf-8">',
    `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'">`,
    '<meta name="robots" content="noindex">',
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<title>Change report — candidate ${e(heading.candidate.slice(0, 20))}</title>`,
    `<style>${style}</style></head><body>`,
    '<p class="private" role="note">Private review page: not part of the published site. Nothing here is on line until the candidate is approved.</p>',
    `<h1>What the candidate changes for readers</h1>`,
    `<p>Candidate <code>${e(heading.candidate.slice(0, 20))}</code> (<code>${e(heading.candidateFolder)}</code>) against ${heading.onLine === null ? 'nothing published yet' : `the release on line <code>${e(heading.onLine)}</code>`}.</p>`,
    `<h2 id="levels">Levels that change (${report.levelChanges.length})</h2>`,
    levelRows.length === 0
      ? '<p>No level goes up or down.</p>'
      : `<table><thead><tr><th scope="col">Segment</th><th scope="col">Rule that moved it</th></tr></thead><tbody>${levelRows.join('')}</tbody></table>`,
    `<h2 id="claims">Trend claims that change (${report.claimChanges.length})</h2>`,
    list(
      report.claimChanges.map((change) => e(claimLine(change))),
      'No trend claim appears, disappears or reverses.',
    ),
    `<h2 id="sentences">Sentences that change (${report.sentenceChanges.length})</h2>`,
    sentenceRows.length === 0
      ? '<p>No sentence changes.</p>'
      : `<table><thead><tr><th scope="col">Where</th><th scope="col">Old</th><th scope="col">New</th></tr></thead><tbody>${sentenceRows.join('')}</tbody></table>`,
    ...(report.archivedChanged.length > 0
      ? [
          `<h2 id="archive">Archived bulletins that change (${report.archivedChanged.length})</h2>`,
          list(
            report.archivedChanged.map((id) => `<code>${e(id)}</code>`),
            '',
          ),
        ]
      : []),
    `<h2 id="left-out">Records newly left out or taken back in</h2>`,
    leftOut,
    `<h2 id="pages-added">Pages added (${report.pagesAdded.length})</h2>`,
    list(
      report.pagesAdded.map((page) => `<code>${e(page)}</code>`),
      'None.',
    ),
    `<h2 id="pages-removed">Pages removed (${report.pagesRemoved.length})</h2>`,
    list(
      report.pagesRemoved.map((page) => `<code>${e(page)}</code>`),
      'None.',
    ),
    '</body></html>',
    '',
  ].join('\n');
}
