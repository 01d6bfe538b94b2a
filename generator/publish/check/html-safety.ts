/**
 * Step: check (page safety, before the swap).
 * Safety check of built pages, run before a release is published and by the tests:
 * - every HTML page carries a Content-Security-Policy meta tag whose script rules allow no
 *   inline script and no third-party origin;
 * - no inline <script> except JSON-LD data (`type="application/ld+json"`), and no script loaded
 *   from another origin;
 * - no event-handler attribute (`onclick`, `onerror`, …) and no `javascript:` URL anywhere.
 * The page is tokenised by htmlparser2 (a streaming HTML parser, entities decoded), so text that
 * merely looks like markup — escaped input such as `&lt;script&gt;` — is text, as it is in a
 * browser. Streaming keeps this fast enough for thousands of pages (no DOM is built).
 */
import { readFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import path from 'node:path';
import { Worker } from 'node:worker_threads';
import { Parser } from 'htmlparser2';
import { giveTurn } from '../../event-loop.ts';

/**
 * Version of the rules below. A published manifest records it; a page byte-identical to one
 * published under the same rules need not be parsed again. Raise it whenever a rule changes.
 */
export const safetyRulesVersion = 1;

interface SafetyProblem {
  page: string;
  problem: string;
}

/** Problems with a policy text; empty when it forbids inline and third-party script. */
export function policyProblems(policy: string): string[] {
  const directives = new Map<string, string[]>();
  for (const part of policy.split(';')) {
    const [name, ...values] = part.trim().split(/\s+/);
    if (name) directives.set(name.toLowerCase(), values);
  }
  const problems: string[] = [];
  const scriptRule = directives.get('script-src') ?? directives.get('default-src');
  if (!scriptRule) problems.push('has no script-src or default-src directive');
  for (const [name, values] of directives) {
    for (const value of values) {
      const lower = value.toLowerCase();
      if ((name === 'script-src' || name === 'default-src') && (lower === "'unsafe-inline'" || lower === "'unsafe-eval'")) {
        problems.push(`${name} allows ${value}`);
      }
      if (lower === '*' || /^(https?|wss?):/.test(lower) || (/^[a-z0-9*.-]+\.[a-z]{2,}/.test(lower) && !lower.startsWith("'"))) {
        problems.push(`${name} allows another origin (${value})`);
      }
    }
  }
  return problems;
}

function isSameOrigin(url: string): boolean {
  const trimmed = url.trim();
  return !/^[a-z][a-z0-9+.-]*:/i.test(trimmed) && !trimmed.startsWith('//');
}

const urlAttributes = new Set(['href', 'src', 'action', 'formaction', 'xlink:href', 'data', 'poster']);

/** Checks one page's HTML; `page` only names it in the problems. */
export function pageProblems(page: string, html: string): SafetyProblem[] {
  const problems: SafetyProblem[] = [];
  let policies = 0;
  const parser = new Parser(
    {
      onopentag(name, attributes) {
        if (name === 'meta' && (attributes['http-equiv'] ?? '').toLowerCase() === 'content-security-policy') {
          policies += 1;
          for (const problem of policyProblems(attributes['content'] ?? '')) {
            problems.push({ page, problem: `Content-Security-Policy ${problem}` });
          }
        }
        if (name === 'script') {
          const type = (attributes['type'] ?? '').trim().toLowerCase();
          const source = attributes['src'];
          if (source !== undefined) {
            if (!isSameOrigin(source)) problems.push({ page, problem: `loads a script from another origin: ${source}` });
          } else if (type !== 'application/ld+json') {
            problems.push({ page, problem: `has an inline <script${type ? ` type="${type}"` : ''}>` });
          }
        }
        for (const [attribute, value] of Object.entries(attributes)) {
          if (attribute.startsWith('on')) {
            problems.push({ page, problem: `<${name}> has an event-handler attribute ${attribute}` });
          }
          if (urlAttributes.has(attribute) && /^\s*javascript:/i.test(value)) {
            problems.push({ page, problem: `<${name}> has a javascript: URL in ${attribute}` });
          }
        }
      },
    },
    { decodeEntities: true, lowerCaseTags: true, lowerCaseAttributeNames: true, recognizeSelfClosing: true },
  );
  parser.write(html);
  parser.end();
  if (policies === 0) problems.unshift({ page, problem: 'has no Content-Security-Policy meta tag' });
  return problems;
}

/** Checks every `.html` file among `files` (paths relative to `root`). */
export async function siteProblems(root: string, files: readonly string[]): Promise<SafetyProblem[]> {
  const problems: SafetyProblem[] = [];
  for (const [i, file] of files.entries()) {
    if (!file.endsWith('.html')) continue;
    // Read synchronously (thousands of small files); other work gets a turn now and then.
    if (i % 32 === 31) await giveTurn();
    problems.push(...pageProblems(file, readFileSync(path.join(root, file), 'utf8')));
  }
  return problems;
}

/** Pages per worker thread below which one thread (this one) checks everything. */
const pagesPerThread = 500;

/**
 * siteProblems spread over worker threads (html-safety-worker.mjs), one per core up to
 * `threads`; the same problems in the same order. This thread stays free meanwhile.
 */
export async function siteProblemsInParallel(
  root: string,
  files: readonly string[],
  threads: number = availableParallelism(),
  minPagesPerThread: number = pagesPerThread,
): Promise<SafetyProblem[]> {
  const pages = files.filter((file) => file.endsWith('.html'));
  const count = Math.max(1, Math.min(threads, Math.floor(pages.length / minPagesPerThread)));
  if (count === 1) return siteProblems(root, pages);
  const size = Math.ceil(pages.length / count);
  const parts = Array.from({ length: count }, (_, i) => pages.slice(i * size, (i + 1) * size));
  const found = await Promise.all(
    parts.map(
      (part) =>
        new Promise<SafetyProblem[]>((resolve, reject) => {
          const worker = new Worker(new URL('./html-safety-worker.mjs', import.meta.url), { workerData: { root, files: part } });
          worker.once('message', (problems: SafetyProblem[]) => resolve(problems));
          worker.once('error', reject);
          worker.once('exit', (code) => {
            if (code !== 0) reject(new Error(`page safety check thread stopped with code ${code}`));
          });
        }),
    ),
  );
  return found.flat();
}
