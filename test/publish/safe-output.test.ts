// Output paths cannot leave the output folder, and built pages must carry a security policy
// that allows no inline and no third-party script (Content Security Policy Level 3, W3C: the
// 'unsafe-inline' keyword and host-source expressions).
import { describe, expect, test } from 'vitest';
import { pageProblems, policyProblems } from '../../generator/publish/check/html-safety.ts';
import { assertSlug, isSlug, resolveInside } from '../../generator/publish/check/safe-path.ts';
import { page, policy } from './helpers/fake-site.ts';

describe('segment ids and output paths', () => {
  test.each(['north-bay', 'a', '0-9', 'x'.repeat(63)])('%s is a slug', (id) => expect(isSlug(id)).toBe(true));
  test.each(['', '../etc', 'a/b', 'North', '-lead', 'a b', '..', 'x'.repeat(64), 'a\\b', 'é'])('%j is not a slug', (id) => {
    expect(isSlug(id)).toBe(false);
    expect(() => assertSlug(id, 'segment id')).toThrow(/segment id .* is not a slug/);
  });
  test('paths resolve inside the root or throw', () => {
    expect(resolveInside('/srv/site', 'seasons/2026-autumn/a/')).toBe('/srv/site/seasons/2026-autumn/a');
    expect(() => resolveInside('/srv/site', '../other')).toThrow(/outside the output folder/);
    expect(() => resolveInside('/srv/site', 'a/../../other')).toThrow(/outside the output folder/);
    expect(() => resolveInside('/srv/site', '/etc/passwd')).toThrow(/absolute/);
    expect(() => resolveInside('/srv/site', '.')).toThrow(/outside/);
  });
});

describe('page safety', () => {
  test('the stand-in pages pass', () => {
    expect(pageProblems('index.html', page('t', '<p>hi</p>'))).toEqual([]);
  });
  test('JSON-LD and same-origin scripts are allowed, inline script is not', () => {
    const ok = page('t', '<script type="application/ld+json">{"@type":"Dataset"}</script><script src="/_astro/a.js" type="module"></script>');
    expect(pageProblems('p', ok)).toEqual([]);
    expect(pageProblems('p', page('t', '<script>alert(1)</script>')).map((x) => x.problem)).toEqual(['has an inline <script>']);
    expect(pageProblems('p', page('t', '<script src="https://cdn.example/x.js"></script>'))[0]?.problem).toContain('another origin');
  });
  test('event handlers and javascript: URLs are found; escaped text is not', () => {
    const bad = page('t', '<img src="x" onerror="alert(1)"><a href=" javascript:alert(1)">x</a>');
    expect(pageProblems('p', bad).map((x) => x.problem)).toEqual(['<img> has an event-handler attribute onerror', '<a> has a javascript: URL in href']);
    const escaped = page('t', '<p>&lt;script&gt;alert(1)&lt;/script&gt; &quot;&gt;&lt;img src=x onerror=alert(1)&gt; javascript:alert(1)</p>');
    expect(pageProblems('p', escaped)).toEqual([]);
  });
  test('a page without the policy, or with a weak one, is reported', () => {
    expect(pageProblems('p', '<!doctype html><html><head></head><body></body></html>')[0]?.problem).toBe('has no Content-Security-Policy meta tag');
    expect(policyProblems(policy)).toEqual([]);
    expect(policyProblems("default-src 'self'; script-src 'self' 'unsafe-inline'")).toEqual(["script-src allows 'unsafe-inline'"]);
    expect(policyProblems("default-src 'self' https://tiles.example")).toEqual(['default-src allows another origin (https://tiles.example)']);
    expect(policyProblems("img-src 'self'")).toEqual(['has no script-src or default-src directive']);
  });
});
