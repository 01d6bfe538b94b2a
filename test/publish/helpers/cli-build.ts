/**
 * Runs `wrackline build` as a real process (the installed entry point), under the shared Astro
 * lock file when `flock` exists (several Astro builds at once on two cores only slow each other).
 */
import { execFile } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';

export const packageRoot = path.resolve(import.meta.dirname, '..', '..', '..');

export interface CliRun {
  code: number;
  stdout: string;
  stderr: string;
}

/** `lock: false` for runs that stop before Astro (no need to wait for other builds). */
export function runCli(args: string[], env: NodeJS.ProcessEnv = {}, options: { lock?: boolean } = {}): Promise<CliRun> {
  const entry = path.join(packageRoot, 'bin', 'wrackline.mjs');
  const lock = '/tmp/astro.lock';
  const [command, argv] =
    options.lock !== false && existsSync('/usr/bin/flock') ? ['/usr/bin/flock', [lock, process.execPath, entry, ...args]] : [process.execPath, [entry, ...args]];
  return new Promise((resolve) => {
    execFile(command, argv, { cwd: packageRoot, env: { ...process.env, CI: 'true', ...env }, maxBuffer: 64 * 1024 * 1024 }, (error, stdout, stderr) => {
      const code = error ? (typeof error.code === 'number' ? error.code : 1) : 0;
      resolve({ code, stdout, stderr });
    });
  });
}
