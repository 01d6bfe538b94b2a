/**
 * The Content-Security-Policy every page carries in a meta element: scripts only from this
 * origin and never inline, no plugins, no <base>. `frame-ancestors` is ignored (and warned
 * about) in a meta element, so it belongs in an HTTP header from the server; none is set here,
 * so the chart pages under /embed/ can be framed by any site. A host should send:
 *   for /embed/*:         Content-Security-Policy: frame-ancestors *
 *                         (or a list of the news sites allowed to frame the charts)
 *   for every other path: Content-Security-Policy: frame-ancestors 'self'
 *                         X-Frame-Options: SAMEORIGIN   (for browsers without CSP level 2)
 * A header policy and the meta policy are both enforced; the header needs only that directive.
 * `wrackline serve` sends these headers (generator/cli/serve.ts, framingHeaders).
 * `wasm` adds 'wasm-unsafe-eval' (lets WebAssembly compile, not JavaScript eval) for the
 * search page, whose optional index runs as WebAssembly.
 */
export function cspContent(options: { wasm?: boolean } = {}): string {
  const script = options.wasm ? "script-src 'self' 'wasm-unsafe-eval'" : "script-src 'self'";
  return ["default-src 'self'", script, "style-src 'self' 'unsafe-inline'", "img-src 'self' data:", "object-src 'none'", "base-uri 'none'", "form-action 'self'"].join('; ');
}
