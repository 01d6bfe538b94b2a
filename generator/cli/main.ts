/**
 * The `wrackline` command: reads the first word of the arguments and hands the rest to that
 * command. Returns the exit code: 0 ok, 1 invalid data, 2 bad usage or unreadable file.
 * Commands are imported only when used, so `wrackline --help` answers at once and one
 * command's missing dependency cannot break another.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';

type Runner = (argv: string[], io: MainIo) => Promise<number>;

interface CommandEntry {
  summary: string;
  load: () => Promise<Runner>;
}

const commands: { [name: string]: CommandEntry } = {
  build: {
    summary: 'validate a scenario, compute the bulletins and publish the static site',
    load: async () => (await import('./build.ts')).runBuild,
  },
  review: {
    summary: 'show what a staged candidate (build --candidate) changes against the release on line',
    load: async () => (await import('./review.ts')).runReview,
  },
  approve: {
    summary: 'publish the reviewed candidate, recording who approved it and when',
    load: async () => (await import('./approve.ts')).runApprove,
  },
  check: {
    summary: 'validate a scenario only; exit 1 when it has errors',
    load: async () => (await import('./check.ts')).runCheck,
  },
  init: {
    summary: 'write a new, empty scenario to fill in with your own data',
    load: async () => (await import('./init.ts')).runInit,
  },
  trend: {
    summary: "trend statistics for one series in a CSV file (Mann–Kendall, Sen's slope)",
    load: async () => (await import('./trend.ts')).runTrend,
  },
  serve: {
    summary: 'preview a built site on this computer (127.0.0.1)',
    load: async () => (await import('./serve.ts')).runServe,
  },
};

export function version(): string {
  const manifest = JSON.parse(readFileSync(fileURLToPath(new URL('../../package.json', import.meta.url)), 'utf8')) as {
    version?: string;
  };
  return manifest.version ?? '0.0.0';
}

export function mainHelp(): string {
  const width = Math.max(...Object.keys(commands).map((name) => name.length));
  const list = Object.entries(commands).map(([name, entry]) => `  ${name.padEnd(width)}  ${entry.summary}`);
  return [
    `wrackline ${version()} — seasonal coastal plastic-pollution bulletins from validated evidence`,
    '',
    'Usage: wrackline <command> [options]',
    '',
    'Commands:',
    ...list,
    '',
    'Options:',
    '  -h, --help      show this help (or `wrackline <command> --help` for a command)',
    '  -V, --version   print the version',
    '',
    'Examples:',
    '  wrackline init my-coast',
    '  wrackline check --scenario content/demo',
    '  wrackline build --scenario content/demo --out dist',
    '  wrackline build --scenario content/demo --out dist --candidate && wrackline review --out dist',
    '  wrackline trend series.csv --seasonal --json',
    '  wrackline serve --dir dist',
    '',
    'Exit codes: 0 ok, 1 invalid data, 2 bad usage or unreadable file',
  ].join('\n');
}

/** Edit distance, for "did you mean" on a mistyped command. */
function distance(a: string, b: string): number {
  let previousRow = Array.from({ length: b.length + 1 }, (_, index) => index);
  for (let i = 1; i <= a.length; i += 1) {
    const row = [i];
    for (let j = 1; j <= b.length; j += 1) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      row.push(Math.min((row[j - 1] ?? 0) + 1, (previousRow[j] ?? 0) + 1, (previousRow[j - 1] ?? 0) + cost));
    }
    previousRow = row;
  }
  return previousRow[b.length] ?? 0;
}

export interface MainIo {
  stdout?: (text: string) => void;
  stderr?: (text: string) => void;
}

export async function main(argv: string[], io: MainIo = {}): Promise<number> {
  const stdout = io.stdout ?? ((text: string) => process.stdout.write(`${text}\n`));
  const stderr = io.stderr ?? ((text: string) => process.stderr.write(`${text}\n`));
  const [first, ...rest] = argv;

  if (first === undefined || first.startsWith('-')) {
    let values;
    try {
      ({ values } = parseArgs({
        args: argv,
        strict: true,
        allowPositionals: false,
        options: { help: { type: 'boolean', short: 'h' }, version: { type: 'boolean', short: 'V' } },
      }));
    } catch (error) {
      stderr(`wrackline: ${error instanceof Error ? error.message : String(error)}\nRun \`wrackline --help\` for usage.`);
      return 2;
    }
    if (values.version) {
      stdout(version());
      return 0;
    }
    if (values.help) {
      stdout(mainHelp());
      return 0;
    }
    stderr(`wrackline: no command given\n\n${mainHelp()}`);
    return 2;
  }

  if (first === 'help') {
    const topic = rest[0];
    if (topic !== undefined && commands[topic]) return main([topic, '--help'], io);
    stdout(mainHelp());
    return 0;
  }

  const entry = commands[first];
  if (!entry) {
    const suggestion = Object.keys(commands)
      .map((name) => ({ name, cost: distance(first, name) }))
      .filter((candidate) => candidate.cost <= 2)
      .sort((a, b) => a.cost - b.cost)[0];
    stderr(
      `wrackline: unknown command ${JSON.stringify(first)}${suggestion ? ` — did you mean "${suggestion.name}"?` : ''}\n` +
        `Commands: ${Object.keys(commands).join(', ')}. Run \`wrackline --help\` for usage.`,
    );
    return 2;
  }

  let run: Runner;
  try {
    run = await entry.load();
  } catch (error) {
    stderr(`wrackline ${first}: this command is not available in this installation (${error instanceof Error ? error.message : String(error)})`);
    return 2;
  }
  return run(rest, io);
}
