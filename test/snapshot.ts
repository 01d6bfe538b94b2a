/**
 * SVG snapshot tests of the pictures the site draws (charts and maps), after Observable Plot's
 * practice: a scenario is a named function whose name is the snapshot's file name
 * (`test/output/<name>.svg`); the picture is normalised first — every number rounded to 3
 * decimals, generated ids renumbered in order of appearance, one element per line — so a
 * snapshot changes only when the picture does. On a mismatch the new picture is written beside
 * the old one as `<name>-changed.svg` (ignored by git) for review in a browser, and the test fails;
 * `npx vitest run test/charts -u` accepts every change. A missing snapshot is written on a
 * developer's machine and is a failure on CI (CI is set), as with any vitest snapshot.
 *
 *   svgSnapshot(function trendWithBandAndThreshold() { return renderIndicatorChart(…); });
 */
import { existsSync, readFileSync, rmSync } from 'node:fs';
import { writeFile } from 'node:fs/promises';
import path from 'node:path';
import { expect, test } from 'vitest';

/** Where snapshots live: test/output/<name>.svg. */
export const snapshotFolder = path.join(import.meta.dirname, 'output');

/** Numbers rounded to 3 decimals (trailing zeros and a negative zero dropped). */
function roundNumbers(text: string): string {
  return text.replace(/-?\d*\.\d+(?:e[-+]?\d+)?/gi, (match) => {
    const rounded = Number(Number(match).toFixed(3));
    return String(Object.is(rounded, -0) ? 0 : rounded);
  });
}

/**
 * Renumbers every id the picture defines (`id="…"`) as `id-1`, `id-2`… in order of first
 * appearance, with every reference to it (`#…`, `url(#…)`, `aria-labelledby`), and Plot's
 * generated class names (`plot-<hex>`) as `plot-1`, `plot-2`…
 */
function renumberIds(svg: string): string {
  const ids = new Map<string, string>();
  for (const match of svg.matchAll(/\bid="([^"]+)"/g)) {
    const id = match[1] as string;
    if (!ids.has(id)) ids.set(id, `id-${ids.size + 1}`);
  }
  const renamed = (id: string): string => ids.get(id) ?? id;
  const classes = new Map<string, string>();
  return svg
    .replace(/\bid="([^"]+)"/g, (_, id: string) => `id="${renamed(id)}"`)
    .replace(/url\(#([^)]+)\)/g, (_, id: string) => `url(#${renamed(id)})`)
    .replace(/\bhref="#([^"]+)"/g, (_, id: string) => `href="#${renamed(id)}"`)
    .replace(/\b(aria-labelledby|aria-describedby)="([^"]*)"/g, (_, name: string, list: string) => `${name}="${list.split(/\s+/).map(renamed).join(' ')}"`)
    .replace(/\bplot-[0-9a-f]{6}\b/g, (name) => {
      let replacement = classes.get(name);
      if (replacement === undefined) {
        replacement = `plot-${classes.size + 1}`;
        classes.set(name, replacement);
      }
      return replacement;
    });
}

/** One element (or text run) per line, indented by depth; attribute order as drawn. */
function beautify(svg: string): string {
  const tokens = svg.match(/<[^>]+>|[^<]+/g) ?? [];
  const lines: string[] = [];
  let depth = 0;
  for (let i = 0; i < tokens.length; i++) {
    const token = tokens[i] as string;
    const next = tokens[i + 1];
    const after = tokens[i + 2];
    // an element holding only text stays on one line, its text untouched
    if (/^<[a-zA-Z][^>]*[^/]>$/.test(token) && next !== undefined && !next.startsWith('<') && after?.startsWith('</')) {
      lines.push(`${'  '.repeat(depth)}${token}${next}${after}`);
      i += 2;
      continue;
    }
    if (!token.startsWith('<')) {
      const text = token.trim();
      if (text !== '') lines.push(`${'  '.repeat(depth)}${text}`);
      continue;
    }
    if (token.startsWith('</')) {
      depth = Math.max(0, depth - 1);
      lines.push(`${'  '.repeat(depth)}${token}`);
    } else {
      lines.push(`${'  '.repeat(depth)}${token}`);
      if (!token.endsWith('/>') && !token.startsWith('<?') && !token.startsWith('<!')) depth += 1;
    }
  }
  return `${lines.join('\n')}\n`;
}

/** The picture as it is compared and stored. */
export function normaliseSvg(svg: string): string {
  return beautify(renumberIds(roundNumbers(svg)));
}

/**
 * Compares a normalised picture with `test/output/<name>.svg`; on a mismatch writes
 * `<name>-changed.svg` beside it and fails.
 */
export async function expectSvgSnapshot(name: string, svg: string): Promise<void> {
  if (!/^[A-Za-z][A-Za-z0-9]*$/.test(name)) throw new Error(`expectSvgSnapshot: "${name}" is not a scenario name`);
  const file = path.join(snapshotFolder, `${name}.svg`);
  const changed = path.join(snapshotFolder, `${name}-changed.svg`);
  const actual = normaliseSvg(svg);
  const expected = existsSync(file) ? readFileSync(file, 'utf8') : null;
  if (expected !== null && expected !== actual) await writeFile(changed, actual);
  else rmSync(changed, { force: true });
  await expect(actual, `picture ${name} changed: compare ${path.relative(process.cwd(), changed)} with ${path.relative(process.cwd(), file)}`).toMatchFileSnapshot(file);
}

/** A snapshot test named after its scenario function, which returns the SVG to compare. */
export function svgSnapshot(scenario: () => string | Promise<string>): void {
  test(scenario.name, async () => {
    await expectSvgSnapshot(scenario.name, await scenario());
  });
}
