// Where `--out` points must never cost the user a file, and a place that cannot be used ends
// within seconds with one or two plain lines and exit 2 (the exit codes of README.md). The
// read-only and full-disk cases mount a small tmpfs and run only where this process may mount
// (root in a container); elsewhere they are skipped, and say so.
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, test } from 'vitest';
import { plainWriteFailure } from '../../generator/publish/swap/output-place.ts';
import { baseScenario } from '../read/fixture-scenario.ts';
import { runCli } from '../publish/helpers/cli-build.ts';

const mounted: string[] = [];

function canMount(): boolean {
  if (process.getuid?.() !== 0) return false;
  const probe = mkdtempSync(path.join(tmpdir(), 'wrackline-mount-probe-'));
  try {
    execFileSync('mount', ['-t', 'tmpfs', '-o', 'size=1m', 'tmpfs', probe], { stdio: 'ignore' });
    execFileSync('umount', [probe], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
}
const mountable = canMount();

function tmpfs(options: string): string {
  const dir = mkdtempSync(path.join(tmpdir(), 'wrackline-tmpfs-'));
  execFileSync('mount', ['-t', 'tmpfs', '-o', options, 'tmpfs', dir]);
  mounted.push(dir);
  return dir;
}

afterAll(() => {
  for (const dir of mounted) execFileSync('umount', [dir]);
});

function expectPlainRefusal(run: { code: number; stderr: string; stdout: string }, mention: RegExp): void {
  expect(run.code, run.stderr).toBe(2);
  const lines = run.stderr.trim().split('\n');
  expect(lines.length, run.stderr).toBeLessThanOrEqual(2);
  expect(run.stderr).toMatch(mention);
  expect(run.stderr).not.toMatch(/\n\s+at |Error:/);
}

async function build(out: string, extra: string[] = []): Promise<{ code: number; stderr: string; stdout: string; seconds: number }> {
  const started = Date.now();
  const run = await runCli(['build', '--scenario', baseScenario, '--out', out, '--quiet', ...extra], {}, { lock: false });
  return { ...run, seconds: (Date.now() - started) / 1000 };
}

describe('--out never takes over or hangs', () => {
  test('--out at an existing non-empty user folder is refused before anything is created (default cache)', async () => {
    const work = mkdtempSync(path.join(tmpdir(), 'wrackline-out-'));
    const user = path.join(work, 'mine');
    mkdirSync(user);
    writeFileSync(path.join(user, 'notes.txt'), 'my notes');
    const run = await build(user);
    expectPlainRefusal(run, /not published by this tool/);
    expect(readFileSync(path.join(user, 'notes.txt'), 'utf8')).toBe('my notes');
    expect(existsSync(`${user}.wrackline`)).toBe(false);
  }, 60_000);

  test('--out through a dangling link ends at once with a plain line', async () => {
    const work = mkdtempSync(path.join(tmpdir(), 'wrackline-out-'));
    symlinkSync(path.join(work, 'nowhere'), path.join(work, 'dangling'));
    const run = await build(path.join(work, 'dangling', 'site'));
    expectPlainRefusal(run, /a link to .*nowhere, which does not exist/);
    expect(run.seconds).toBeLessThan(20);
  }, 60_000);

  test('--out below a file ends at once with a plain line', async () => {
    const work = mkdtempSync(path.join(tmpdir(), 'wrackline-out-'));
    writeFileSync(path.join(work, 'file.txt'), 'x');
    expectPlainRefusal(await build(path.join(work, 'file.txt', 'site')), /is a file, not a folder/);
  }, 60_000);

  test('--out under /proc is refused at once instead of hanging', async () => {
    const run = await build('/proc/wrackline-site');
    expectPlainRefusal(run, /inside \/proc, a folder of the operating system/);
    expect(run.seconds).toBeLessThan(20);
  }, 60_000);

  test.skipIf(!mountable)(
    '--out on a read-only file system ends with a plain line (needs mount)',
    async () => {
      const place = tmpfs('size=4m,ro');
      expectPlainRefusal(await build(path.join(place, 'site')), /read-only file system \(EROFS\)/);
    },
    60_000,
  );

  test.skipIf(!mountable)(
    '--out on a full disk ends with a plain line and nothing left behind (needs mount)',
    async () => {
      const place = tmpfs('size=4m');
      try {
        execFileSync('dd', ['if=/dev/zero', `of=${path.join(place, 'filler')}`, 'bs=1M', 'count=8'], { stdio: 'ignore' });
      } catch {
        // dd stops when the disk is full, which is the point
      }
      const run = await build(path.join(place, 'site'));
      expectPlainRefusal(run, /KB free; a build needs at least/);
      expect(existsSync(path.join(place, 'site.wrackline'))).toBe(false);
    },
    60_000,
  );

  test('a disk that fills up during the build is reported in plain words, Astro output included', () => {
    const direct = Object.assign(new Error("ENOSPC: no space left on device, write '/srv/site.wrackline/work-1/x.json'"), {
      code: 'ENOSPC',
      path: '/srv/site.wrackline/work-1/x.json',
    });
    const line = plainWriteFailure(direct, '/srv/site');
    expect(line).toContain('cannot write /srv/site.wrackline/work-1/x.json: the disk is full (ENOSPC)');
    expect(line?.split('\n')).toHaveLength(2);
    const astro = new Error(`astro build failed. Its last output:\n${'  | [build] writing page\n'.repeat(60)}  | Error: ENOSPC: no space left on device, write`);
    expect(plainWriteFailure(astro, '/srv/site')).toMatch(/^cannot write \/srv\/site: the disk is full \(ENOSPC\)/);
    expect(plainWriteFailure(new Error('some other failure'), '/srv/site')).toBeNull();
  });
});
