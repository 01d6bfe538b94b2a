/**
 * What every `wrackline` command shares: where its output goes, and how it reads its options.
 * A bad option is a usage error: the command prints what was wrong and how to get help, and
 * exits with 2.
 */
import { parseArgs, type ParseArgsConfig } from 'node:util';

export interface CommandIo {
  stdout?: (text: string) => void;
  stderr?: (text: string) => void;
}

export interface CommandWriters {
  stdout: (text: string) => void;
  stderr: (text: string) => void;
}

/** The given writers, or the process's own streams, one line per call. */
export function commandWriters(io: CommandIo = {}): CommandWriters {
  return {
    stdout: io.stdout ?? ((text: string) => process.stdout.write(`${text}\n`)),
    stderr: io.stderr ?? ((text: string) => process.stderr.write(`${text}\n`)),
  };
}

/** Print a usage error of `wrackline <command>` and give its exit code, 2. */
export function usageError(stderr: (text: string) => void, command: string, error: unknown, help?: string): 2 {
  const message = error instanceof Error ? error.message : String(error);
  stderr(`wrackline ${command}: ${message}\n${help ?? `Run \`wrackline ${command} --help\` for usage.`}`);
  return 2;
}

/**
 * `parseArgs` for one command. Returns null after printing a usage error when the options do not
 * parse; `help`, when given, is printed instead of the one-line pointer to `--help`.
 */
export function parseCommandOptions<const T extends ParseArgsConfig>(
  command: string,
  config: T,
  stderr: (text: string) => void,
  help?: string,
): ReturnType<typeof parseArgs<T>> | null {
  try {
    return parseArgs(config);
  } catch (error) {
    usageError(stderr, command, error, help);
    return null;
  }
}
