/**
 * `wrackline check`: reads and validates a scenario without computing or publishing anything,
 * and prints the validation report: a table of records read, kept and left out per file, then
 * every error and warning with its place, value, expectation and a hint.
 *
 *   wrackline check [--scenario DIR] [--strict] [--json] [--limit N] [--quiet]
 *
 * Exit codes: 0 no errors (warnings allowed), 1 the scenario has errors, 2 bad usage or an
 * unreadable scenario folder.
 */
import { commandWriters, parseCommandOptions } from './command-io.ts';
import { ScenarioError } from '../errors.ts';
import type { ValidationIssue, ValidationReport } from '../model/types.ts';
import { createProgress, formatCount } from '../progress/progress.ts';
import type { ProgressStream } from '../progress/progress.ts';
import { loadScenario } from '../read/load-scenario.ts';

export const checkHelp = `Usage: wrackline check [options]

Reads and validates a scenario (datapackage.json and every file it lists) and
prints what was read, what was left out and why. Nothing is computed or written.

Options:
  --scenario DIR   scenario folder holding datapackage.json (default: .)
  --strict         treat every warning as an error
  --json           print the validation report as JSON on standard output
  --limit N        show at most N problems of each severity (default: 200; 0 = all)
  --quiet          no progress line
  -h, --help       show this help

Exit codes: 0 no errors (warnings allowed), 1 errors found, 2 bad usage or unreadable folder`;

export interface CheckIo {
  stdout?: (text: string) => void;
  stderr?: (text: string) => void;
  /** Where the progress line goes; defaults to process.stderr (shown live only on a terminal). */
  progressStream?: ProgressStream;
}

function place(issue: ValidationIssue): string {
  const parts = [issue.file];
  if (issue.row !== null) parts.push(`row ${issue.row}`);
  if (issue.column !== null) parts.push(`column ${issue.column}`);
  return parts.join(', ');
}

/** The report as plain text for a terminal or a log. */
export function formatCheckReport(scenarioDir: string, report: ValidationReport, limit = 200): string {
  const errors = report.issues.filter((i) => i.severity === 'error');
  const warnings = report.issues.filter((i) => i.severity === 'warning');
  const leftOut = report.files.reduce((n, f) => n + f.excluded, 0);
  const lines: string[] = [];
  lines.push(`Checked ${scenarioDir}: ${report.files.length} file(s), ${formatCount(leftOut)} record(s) left out, ${errors.length} error(s), ${warnings.length} warning(s)`);
  lines.push('');
  const width = Math.max(4, ...report.files.map((f) => f.file.length));
  lines.push(`  ${'file'.padEnd(width)}  ${'read'.padStart(11)}  ${'kept'.padStart(11)}  ${'left out'.padStart(9)}`);
  for (const f of report.files) {
    lines.push(`  ${f.file.padEnd(width)}  ${formatCount(f.read).padStart(11)}  ${formatCount(f.kept).padStart(11)}  ${formatCount(f.excluded).padStart(9)}`);
  }
  const section = (title: string, items: ValidationIssue[]): void => {
    if (items.length === 0) return;
    lines.push('');
    lines.push(`${title} (${items.length})`);
    const shown = limit > 0 ? items.slice(0, limit) : items;
    for (const item of shown) {
      lines.push(`  - ${item.message}`);
      const details = [`at ${place(item)}`];
      if (item.value !== null) details.push(`value ${JSON.stringify(item.value)}`);
      details.push(`expected ${item.expected}`);
      if (item.excluded) details.push('left out');
      lines.push(`      ${details.join('; ')}`);
      if (item.hint) lines.push(`      hint: ${item.hint}`);
    }
    if (shown.length < items.length) {
      const byCode = new Map<string, number>();
      for (const item of items.slice(shown.length)) byCode.set(item.code ?? 'other', (byCode.get(item.code ?? 'other') ?? 0) + 1);
      const summary = [...byCode.entries()].map(([code, n]) => `${code} ×${formatCount(n)}`).join(', ');
      lines.push(`  … and ${formatCount(items.length - shown.length)} more (${summary}); use --json or --limit 0 to see all`);
    }
  };
  section('Errors', errors);
  section('Warnings', warnings);
  lines.push('');
  lines.push(
    errors.length === 0
      ? `Result: usable — no errors${warnings.length > 0 ? `; ${warnings.length} warning(s), records left out are listed above` : ''}`
      : `Result: not usable — ${errors.length} error(s); a build would stop here`,
  );
  return lines.join('\n');
}

export async function runCheck(argv: string[], io: CheckIo = {}): Promise<number> {
  const { stdout, stderr } = commandWriters(io);
  const parsed = parseCommandOptions(
    'check',
    {
      args: argv,
      strict: true,
      allowPositionals: false,
      options: {
        scenario: { type: 'string' },
        json: { type: 'boolean' },
        strict: { type: 'boolean' },
        limit: { type: 'string' },
        quiet: { type: 'boolean' },
        help: { type: 'boolean', short: 'h' },
      },
    },
    stderr,
  );
  if (parsed === null) return 2;
  const { values } = parsed;
  if (values.help) {
    stdout(checkHelp);
    return 0;
  }
  const limit = values.limit === undefined ? 200 : Number(values.limit);
  if (!Number.isInteger(limit) || limit < 0) {
    stderr(`wrackline check: invalid --limit; not a whole number ≥ 0: ${values.limit ?? ''}`);
    return 2;
  }
  const scenarioDir = values.scenario ?? '.';
  // The progress line is for a person at a terminal only: a log or a pipe gets just the report.
  const stream = io.progressStream ?? process.stderr;
  const progress = createProgress({ quiet: values.quiet === true || values.json === true || stream.isTTY !== true, stream });
  let phase: string | null = null;
  let report: ValidationReport;
  try {
    const scenario = await loadScenario(scenarioDir, {
      strict: values.strict === true,
      onProgress(name, done, total) {
        // File phases count bytes: shown in kB.
        const inBytes = name.startsWith('reading ');
        const label = inBytes ? `${name} (kB)` : name;
        const scale = (n: number | undefined) => (n === undefined ? undefined : inBytes ? Math.round(n / 1024) : n);
        if (label !== phase) {
          phase = label;
          if (name === 'done') progress.end();
          else progress.start(label, scale(total));
        }
        if (name !== 'done' && inBytes) progress.update(scale(done) ?? 0, scale(total));
      },
    });
    progress.end();
    report = scenario.report;
  } catch (error) {
    progress.end();
    if (error instanceof ScenarioError) {
      stderr(`wrackline check: ${error.message}\n  hint: ${error.hint}`);
      return 2;
    }
    throw error;
  }
  if (values.json) stdout(JSON.stringify(report, null, 2));
  else stdout(formatCheckReport(scenarioDir, report, limit));
  return report.ok ? 0 : 1;
}
