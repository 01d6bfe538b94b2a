/**
 * `wrackline serve`: a small static file server for a built site, bound to 127.0.0.1 only
 * (a preview for the person building, not a public web server).
 *
 *   wrackline serve [--dir DIR] [--port N]
 *
 * Requests are mapped to files under the folder's real path; a request that would resolve
 * outside it (../, encoded slashes, links) is answered 404. A folder is served by its
 * index.html, and a folder path without its trailing slash is redirected to it.
 */
import { createReadStream } from 'node:fs';
import { realpath, stat } from 'node:fs/promises';
import { createServer } from 'node:http';
import type { IncomingMessage, Server, ServerResponse } from 'node:http';
import path from 'node:path';
import { commandWriters, parseCommandOptions } from './command-io.ts';

export const serveHelp = `Usage: wrackline serve [options]

Serves a built site folder on this computer only (127.0.0.1) to preview it.

Options:
  --dir DIR    the built site (default: dist)
  --port N     port to listen on, 0 picks a free one (default: 8047)
  -h, --help   show this help

Stop it with Ctrl+C.`;

export const defaultPort = 8047;

const contentTypes: { [extension: string]: string } = {
  '.html': 'text/html; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.geojson': 'application/geo+json',
  '.xml': 'application/xml; charset=utf-8',
  '.atom': 'application/atom+xml; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.jpg': 'image/jpeg',
  '.ico': 'image/x-icon',
  '.webp': 'image/webp',
  '.woff2': 'font/woff2',
  '.txt': 'text/plain; charset=utf-8',
  '.csv': 'text/csv; charset=utf-8',
  '.gz': 'application/gzip',
  '.zip': 'application/zip',
  '.nc': 'application/x-netcdf',
  '.wasm': 'application/wasm',
  '.pf_meta': 'application/octet-stream',
};

export function contentTypeOf(file: string): string {
  return contentTypes[path.extname(file).toLowerCase()] ?? 'application/octet-stream';
}

/** The file a URL path names under `root`, or null when it would leave the root. */
export function fileForUrlPath(root: string, urlPath: string): string | null {
  let decoded: string;
  try {
    decoded = decodeURIComponent(urlPath);
  } catch {
    return null;
  }
  if (decoded.includes('\0') || decoded.includes('\\')) return null;
  const target = path.resolve(root, `.${path.posix.normalize(`/${decoded}`)}`);
  const fromRoot = path.relative(root, target);
  if (fromRoot.startsWith('..') || path.isAbsolute(fromRoot)) return null;
  return target;
}

async function insideRoot(root: string, file: string): Promise<boolean> {
  const real = await realpath(file).catch(() => null);
  if (real === null) return false;
  const fromRoot = path.relative(root, real);
  return !fromRoot.startsWith('..') && !path.isAbsolute(fromRoot);
}

/**
 * Who may show a page inside a frame: a rule browsers take only from a response header, never from
 * the page (see site/lib/csp.ts). The chart pages under /embed/ are made to be framed by other
 * sites; every other page only by this one. The same headers a host should send (README).
 */
export function framingHeaders(urlPath: string): { [name: string]: string } {
  if (urlPath.startsWith('/embed/')) return { 'Content-Security-Policy': 'frame-ancestors *' };
  return { 'Content-Security-Policy': "frame-ancestors 'self'", 'X-Frame-Options': 'SAMEORIGIN' };
}

function send(response: ServerResponse, status: number, headers: { [name: string]: string }, body?: string): void {
  response.writeHead(status, { 'X-Content-Type-Options': 'nosniff', ...headers });
  response.end(body);
}

async function handle(root: string, request: IncomingMessage, response: ServerResponse): Promise<void> {
  if (request.method !== 'GET' && request.method !== 'HEAD') {
    send(response, 405, { Allow: 'GET, HEAD', 'Content-Type': 'text/plain; charset=utf-8' }, 'Method not allowed\n');
    return;
  }
  const url = new URL(request.url ?? '/', 'http://127.0.0.1');
  let file = fileForUrlPath(root, url.pathname);
  let status = 200;
  let info = file === null ? null : await stat(file).catch(() => null);
  if (file !== null && info?.isDirectory()) {
    if (!url.pathname.endsWith('/')) {
      send(response, 301, { Location: `${url.pathname}/${url.search}` });
      return;
    }
    file = path.join(file, 'index.html');
    info = await stat(file).catch(() => null);
  }
  if (file === null || !info?.isFile() || !(await insideRoot(root, file))) {
    const notFound = path.join(root, '404.html');
    const page = await stat(notFound).catch(() => null);
    if (!page?.isFile()) {
      send(response, 404, { 'Content-Type': 'text/plain; charset=utf-8' }, 'Not found\n');
      return;
    }
    file = notFound;
    info = page;
    status = 404;
  }
  response.writeHead(status, {
    'Content-Type': contentTypeOf(file),
    'Content-Length': String(info.size),
    'X-Content-Type-Options': 'nosniff',
    'Cache-Control': 'no-cache',
    ...framingHeaders(url.pathname),
  });
  if (request.method === 'HEAD') {
    response.end();
    return;
  }
  createReadStream(file).pipe(response);
}

/** Starts the server; resolves once it listens. */
export async function startServer(options: { dir: string; port: number }): Promise<{ server: Server; url: string }> {
  const root = await realpath(options.dir);
  const server = createServer((request, response) => {
    handle(root, request, response).catch(() => {
      if (!response.headersSent) send(response, 500, { 'Content-Type': 'text/plain; charset=utf-8' }, 'Server error\n');
      else response.destroy();
    });
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, '127.0.0.1', () => resolve());
  });
  const address = server.address();
  const port = typeof address === 'object' && address !== null ? address.port : options.port;
  return { server, url: `http://127.0.0.1:${port}/` };
}

/** Calls `gone` once the process that started this one has ended (checked every half second). */
export function parentWatch(gone: () => void, intervalMs = 500): NodeJS.Timeout {
  const parent = process.ppid;
  const timer = setInterval(() => {
    if (process.ppid !== parent) {
      clearInterval(timer);
      gone();
    }
  }, intervalMs);
  timer.unref();
  return timer;
}

export async function runServe(argv: string[], io: { stdout?: (text: string) => void; stderr?: (text: string) => void; untilStopped?: Promise<unknown> } = {}): Promise<number> {
  const { stdout, stderr } = commandWriters(io);
  const parsed = parseCommandOptions(
    'serve',
    {
      args: argv,
      strict: true,
      allowPositionals: false,
      options: { dir: { type: 'string' }, port: { type: 'string' }, help: { type: 'boolean', short: 'h' } },
    },
    stderr,
  );
  if (parsed === null) return 2;
  const { values } = parsed;
  if (values.help) {
    stdout(serveHelp);
    return 0;
  }
  const port = values.port === undefined ? defaultPort : Number(values.port);
  if (!Number.isInteger(port) || port < 0 || port > 65535) {
    stderr(`wrackline serve: --port expects a whole number from 0 to 65535, got ${JSON.stringify(values.port)}\nRun \`wrackline serve --help\` for usage.`);
    return 2;
  }
  const dir = path.resolve(values.dir ?? 'dist');
  const found = await stat(dir).catch(() => null);
  if (!found?.isDirectory()) {
    stderr(`wrackline serve: no built site at ${dir}; build one first (npm run build, or wrackline build --out ${values.dir ?? 'dist'})`);
    return 2;
  }
  let started;
  try {
    started = await startServer({ dir, port });
  } catch (error) {
    stderr(`wrackline serve: cannot listen on 127.0.0.1:${port} (${error instanceof Error ? error.message : String(error)})`);
    return 2;
  }
  stdout(`Serving ${dir} at ${started.url} (this computer only). Press Ctrl+C to stop.`);
  let watch: NodeJS.Timeout | undefined;
  const stop =
    io.untilStopped ??
    new Promise<void>((resolve) => {
      process.once('SIGINT', () => resolve());
      process.once('SIGTERM', () => resolve());
      process.once('SIGHUP', () => resolve());
      // Started by another program (npm run preview, an editor): stop when it goes, even when it
      // was killed without passing a signal on (this process is then handed to another parent).
      watch = parentWatch(resolve);
    });
  await stop;
  if (watch) clearInterval(watch);
  const closed = new Promise<void>((resolve) => started.server.close(() => resolve()));
  started.server.closeAllConnections();
  await closed;
  return 0;
}
