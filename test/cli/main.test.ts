// The command line: dispatch, help, version and the exit-code contract (0 ok, 1 invalid data,
// 2 bad usage or unreadable file). The installed entry point is run as a real process too.
import { execFile } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { promisify } from 'node:util';
import { describe, expect, test } from 'vitest';
import { main } from '../../generator/cli/main.ts';

const root = path.resolve(import.meta.dirname, '..', '..');
const run = promisify(execFile);

async function call(argv: string[]): Promise<{ code: number; out: string; err: string }> {
  const out: string[] = [];
  const err: string[] = [];
  const code = await main(argv, { stdout: (t) => out.push(t), stderr: (t) => err.push(t) });
  return { code, out: out.join('\n'), err: err.join('\n') };
}

describe('wrackline', () => {
  test('--help lists every command and exits 0', async () => {
    const result = await call(['--help']);
    expect(result.code).toBe(0);
    for (const command of ['build', 'check', 'trend', 'serve']) expect(result.out).toMatch(new RegExp(`^  ${command} `, 'm'));
  });
  test('--version prints the package version', async () => {
    const version = (JSON.parse(readFileSync(path.join(root, 'package.json'), 'utf8')) as { version: string }).version;
    expect(await call(['--version'])).toEqual({ code: 0, out: version, err: '' });
    expect((await call(['-V'])).out).toBe(version);
  });
  test('no command is bad usage', async () => {
    const result = await call([]);
    expect(result.code).toBe(2);
    expect(result.err).toContain('no command given');
  });
  test('an unknown command is bad usage, with a suggestion', async () => {
    const result = await call(['biuld']);
    expect(result.code).toBe(2);
    expect(result.err).toContain('unknown command "biuld" — did you mean "build"?');
    expect((await call(['frobnicate'])).err).not.toContain('did you mean');
  });
  test('an unknown option is bad usage and names the option', async () => {
    expect(await call(['--colour'])).toMatchObject({ code: 2, err: expect.stringContaining("Unknown option '--colour'") });
    const build = await call(['build', '--scenaro', 'x']);
    expect(build.code).toBe(2);
    expect(build.err).toContain("Unknown option '--scenaro'");
    expect(build.err).toContain('wrackline build --help');
    expect((await call(['serve', '--port', '70000'])).code).toBe(2);
    expect((await call(['build', '--cache', 'c', '--no-cache'])).code).toBe(2);
  });
  test('command help exits 0', async () => {
    expect(await call(['build', '--help'])).toMatchObject({ code: 0, out: expect.stringContaining('Usage: wrackline build') });
    expect(await call(['help', 'serve'])).toMatchObject({ code: 0, out: expect.stringContaining('Usage: wrackline serve') });
  });
  test('serving a folder that does not exist is an unreadable-input error', async () => {
    const result = await call(['serve', '--dir', path.join(root, 'no-such-folder')]);
    expect(result.code).toBe(2);
    expect(result.err).toContain('no built site at');
  });
  test('a scenario folder that cannot be read exits 2', async () => {
    const result = await call(['build', '--scenario', path.join(root, 'no-such-scenario'), '--out', path.join(root, '.wrackline', 'never'), '--quiet']);
    expect(result.code).toBe(2);
  });
  test('the installed entry point answers --help from another folder (as npx runs it)', async () => {
    const { stdout } = await run(process.execPath, [path.join(root, 'bin', 'wrackline.mjs'), '--help'], { cwd: '/' });
    expect(stdout).toContain('Usage: wrackline <command> [options]');
    await expect(run(process.execPath, [path.join(root, 'bin', 'wrackline.mjs'), 'nonsense'], { cwd: '/' })).rejects.toMatchObject({ code: 2 });
  });
  test('npx wrackline --help works in the package', async () => {
    const { stdout } = await run('npx', ['--no-install', 'wrackline', '--help'], { cwd: root });
    expect(stdout).toContain('Commands:');
  });
});
