/**
 * Safety check of built pages, run before a release is published and by the tests:
 * - every HTML page carries a Content-Security-Policy meta tag whose script rules allow no
 *   inline script and no third-party origin;
 * - no inline <script> except JSON-LD data (`type="application/ld+json"`), and no script loaded
 *   from another origin;
 * - no event-handler attribute (`onclick`, `onerror`, …) and no `javascript:` URL anywhere.
 * The page is parsed with linkedom (an HTML parser), so text that merely looks like markup —
 * escaped input such as `&lt;script&gt;` — is text, as it is in a browser.
 */
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { parseHTML } from 'linkedom';

export interface SafetyProblem {
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

/** Checks one page's HTML; `page` only names it in the problems. */
export function pageProblems(page: string, html: string): SafetyProblem[] {
  const problems: SafetyProblem[] = [];
  const { document } = parseHTML(html);
  const metas = [...document.querySelectorAll('meta[http-equiv]')].filter(
    (meta) => (meta.getAttribute('http-equiv') ?? '').toLowerCase() === 'content-security-policy',
  );
  if (metas.length === 0) problems.push({ page, problem: 'has no Content-Security-Policy meta tag' });
  for (const meta of metas) {
    for (const problem of policyProblems(meta.getAttribute('content') ?? '')) {
      problems.push({ page, problem: `Content-Security-Policy ${problem}` });
    }
  }
  for (const script of document.querySelectorAll('script')) {
    const type = (script.getAttribute('type') ?? '').trim().toLowerCase();
    const source = script.getAttribute('src');
    if (source !== null) {
      if (!isSameOrigin(source)) problems.push({ page, problem: `loads a script from another origin: ${source}` });
    } else if (type !== 'application/ld+json') {
      problems.push({ page, problem: `has an inline <script${type ? ` type="${type}"` : ''}>` });
    }
  }
  for (const element of document.querySelectorAll('*')) {
    for (const attribute of element.attributes) {
      const name = attribute.name.toLowerCase();
      if (name.startsWith('on')) {
        problems.push({ page, problem: `<${element.tagName.toLowerCase()}> has an event-handler attribute ${name}` });
      }
      if (['href', 'src', 'action', 'formaction', 'xlink:href'].includes(name) && /^\s*javascript:/i.test(attribute.value)) {
        problems.push({ page, problem: `<${element.tagName.toLowerCase()}> has a javascript: URL in ${name}` });
      }
    }
  }
  return problems;
}

/** Checks every `.html` file among `files` (paths relative to `root`). */
export async function siteProblems(root: string, files: readonly string[]): Promise<SafetyProblem[]> {
  const problems: SafetyProblem[] = [];
  for (const file of files) {
    if (!file.endsWith('.html')) continue;
    problems.push(...pageProblems(file, await readFile(path.join(root, file), 'utf8')));
  }
  return problems;
}
