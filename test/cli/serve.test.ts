// The preview server: 127.0.0.1 only, folder index pages, redirects to the trailing slash,
// the site's 404 page, and no file outside the served folder (RFC 3986 dot-segments and
// percent-encoded ones must not climb out).
import { mkdir, mkdtemp, rm, symlink, writeFile } from 'node:fs/promises';
import type { Server } from 'node:http';
import { request } from 'node:http';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { fileForUrlPath, framingHeaders, startServer } from '../../generator/cli/serve.ts';

let work: string;
let server: Server;
let base: string;

beforeAll(async () => {
  work = await mkdtemp(path.join(tmpdir(), 'wrackline-serve-'));
  const site = path.join(work, 'releases', 'r1');
  await mkdir(path.join(site, 'seasons', 'a'), { recursive: true });
  await writeFile(path.join(site, 'index.html'), '<p>home</p>');
  await writeFile(path.join(site, 'seasons', 'a', 'index.html'), '<p>season</p>');
  await writeFile(path.join(site, '404.html'), '<p>not here</p>');
  await writeFile(path.join(site, 'style.css'), 'p{}');
  await writeFile(path.join(work, 'secret.txt'), 'secret');
  await symlink(path.join(work, 'secret.txt'), path.join(site, 'escape.txt'));
  await symlink(path.join('releases', 'r1'), path.join(work, 'dist')); // served through a link, as published
  ({ server, url: base } = await startServer({ dir: path.join(work, 'dist'), port: 0 }));
});
afterAll(async () => {
  server.closeAllConnections();
  await new Promise((resolve) => server.close(resolve));
  await rm(work, { recursive: true, force: true });
});

function get(rawPath: string): Promise<{ status: number; body: string; headers: { [k: string]: string | string[] | undefined } }> {
  const { port } = new URL(base);
  return new Promise((resolve, reject) => {
    const req = request({ host: '127.0.0.1', port: Number(port), path: rawPath, method: 'GET' }, (res) => {
      let body = '';
      res.on('data', (chunk: Buffer) => (body += chunk.toString()));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body, headers: res.headers }));
    });
    req.on('error', reject);
    req.end();
  });
}

describe('serve', () => {
  test('listens on 127.0.0.1 only', () => {
    expect(base).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/$/);
    const address = server.address();
    expect(typeof address === 'object' && address?.address).toBe('127.0.0.1');
  });
  test('folders are served by their index page; a missing slash is redirected', async () => {
    expect(await get('/')).toMatchObject({ status: 200, body: '<p>home</p>' });
    expect((await get('/')).headers['content-type']).toBe('text/html; charset=utf-8');
    expect(await get('/seasons/a/')).toMatchObject({ status: 200, body: '<p>season</p>' });
    const redirect = await get('/seasons/a');
    expect(redirect.status).toBe(301);
    expect(redirect.headers.location).toBe('/seasons/a/');
    expect((await get('/style.css')).headers['content-type']).toBe('text/css; charset=utf-8');
  });
  // frame-ancestors is honoured only as a header, not in a meta element (W3C Content Security
  // Policy Level 2, 2016, the frame-ancestors directive; section number 7.7 from memory);
  // X-Frame-Options for older browsers (RFC 7034, 2013).
  test('pages may be framed only by this site, the embed pages by any', async () => {
    const home = await get('/');
    expect(home.headers['content-security-policy']).toBe("frame-ancestors 'self'");
    expect(home.headers['x-frame-options']).toBe('SAMEORIGIN');
    expect(framingHeaders('/embed/north-bay/beach-litter/')).toEqual({ 'Content-Security-Policy': 'frame-ancestors *' });
    expect(framingHeaders('/seasons/2026-autumn/north-bay/')['X-Frame-Options']).toBe('SAMEORIGIN');
  });
  test('unknown paths get the 404 page', async () => {
    expect(await get('/nothing/')).toMatchObject({ status: 404, body: '<p>not here</p>' });
  });
  test.each(['/../secret.txt', '/%2e%2e/secret.txt', '/seasons/..%2f..%2fsecret.txt', '/escape.txt', '/%00'])('%s does not leave the folder', async (attack) => {
    const response = await get(attack);
    expect(response.body).not.toContain('secret');
    expect(response.status).toBe(404);
  });
  test('url paths map inside the root', () => {
    expect(fileForUrlPath('/srv', '/a/../../b')).toBe('/srv/b');
    expect(fileForUrlPath('/srv', '/%E0%A4%A')).toBeNull();
  });
});

// `npm run preview` killed (even with SIGKILL, which passes no signal on) must not leave the
// preview server running: the server notices its parent is gone.
describe('the preview server and the program that started it', () => {
  test('stops when its parent is killed', { timeout: 30_000 }, async () => {
    const { spawn } = await import('node:child_process');
    const entry = path.resolve(import.meta.dirname, '..', '..', 'bin', 'wrackline.mjs');
    const site = path.join(work, 'dist');
    // a parent shell that starts the server in the background and prints its pid
    const parent = spawn('/bin/sh', ['-c', `"${process.execPath}" "${entry}" serve --dir "${site}" --port 0 & echo $!; wait`], { stdio: ['ignore', 'pipe', 'ignore'] });
    const pid = await new Promise<number>((resolve) => parent.stdout.once('data', (chunk: Buffer) => resolve(Number.parseInt(chunk.toString(), 10))));
    const alive = (): boolean => {
      try {
        process.kill(pid, 0);
        return true;
      } catch {
        return false;
      }
    };
    // wait until it serves (it prints its address), then kill the parent outright
    await new Promise((resolve) => setTimeout(resolve, 3000));
    expect(alive()).toBe(true);
    parent.kill('SIGKILL');
    const deadline = Date.now() + 15_000;
    while (alive() && Date.now() < deadline) await new Promise((resolve) => setTimeout(resolve, 200));
    const stillAlive = alive();
    if (stillAlive) process.kill(pid, 'SIGTERM');
    expect(stillAlive).toBe(false);
  });
});
