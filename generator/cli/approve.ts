/**
 * `wrackline approve`: publishes the staged, reviewed candidate in one atomic step and records
 * who approved it and when (generator/publish/swap/approval.ts).
 *
 *   wrackline approve --by NAME [--out DIR] [--at ISO-8601]
 *
 * Exit codes: 0 published, 1 refused (the release on line or the inputs changed since staging),
 * 2 bad usage or no candidate staged.
 */
import path from 'node:path';
import { commandWriters, parseCommandOptions, usageError } from './command-io.ts';
import { approveCandidate } from '../publish/swap/approval.ts';
import { PublishError } from '../publish/publish-error.ts';

export const approveHelp = `Usage: wrackline approve --by NAME [options]

Publishes the staged candidate (wrackline build --candidate), after its review
(wrackline review), in one atomic step. Refused when the release on line or the
candidate's input files changed since it was staged. Who approved it and when
is recorded in the release's manifest.json and shown on its methods page.

Options:
  --by NAME    who approves the release (required)
  --out DIR    the published output folder (default: dist)
  --at TIME    the approval time, ISO 8601 with a time zone
               (default: now, from this computer's clock)
  -h, --help   show this help`;

export interface ApproveIo {
  stdout?: (text: string) => void;
  stderr?: (text: string) => void;
  /** The clock used when --at is not given (tests). */
  now?: () => Date;
}

export async function runApprove(argv: string[], io: ApproveIo = {}): Promise<number> {
  const { stdout, stderr } = commandWriters(io);
  const parsed = parseCommandOptions(
    'approve',
    {
      args: argv,
      strict: true,
      allowPositionals: false,
      options: { by: { type: 'string' }, out: { type: 'string' }, at: { type: 'string' }, help: { type: 'boolean', short: 'h' } },
    },
    stderr,
  );
  if (parsed === null) return 2;
  const { values } = parsed;
  if (values.help) {
    stdout(approveHelp);
    return 0;
  }
  if (values.by === undefined) return usageError(stderr, 'approve', new Error('--by NAME is required: who approves this release'));
  let at: Date;
  if (values.at !== undefined) {
    if (!/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:\d{2})$/.test(values.at) || Number.isNaN(Date.parse(values.at))) {
      return usageError(stderr, 'approve', new Error(`--at expects an ISO 8601 time with a time zone (2026-12-01T09:30:00Z), got ${JSON.stringify(values.at)}`));
    }
    at = new Date(values.at);
  } else {
    at = (io.now ?? (() => new Date()))();
  }
  try {
    const outcome = await approveCandidate({ out: path.resolve(values.out ?? 'dist'), by: values.by, at, log: (line) => stderr(`  ${line}`) });
    stdout(`Published ${path.basename(outcome.release)}, approved by ${outcome.approval.by} at ${outcome.approval.at}`);
    return 0;
  } catch (error) {
    if (error instanceof PublishError) {
      stderr(`wrackline approve: ${error.message}`);
      return error.exitCode;
    }
    stderr(`wrackline approve failed; nothing was published.\n${error instanceof Error ? (error.stack ?? error.message) : String(error)}`);
    return 1;
  }
}
