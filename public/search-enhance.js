// Optional search box for /search/: loads the static index that pagefind writes after the
// build, in parts (search-index/parts.json lists them): the first part's search engine loads,
// and the other parts are merged into it. Without JavaScript, or without the index, the plain
// list on the page stays the way in. Results are written with textContent only (never as HTML).
const box = document.getElementById('search-box');
const input = document.getElementById('search-input');
const status = document.getElementById('search-status');
const results = document.getElementById('search-results');

async function start() {
  if (!box || !input || !status || !results) return;
  let engine;
  try {
    const listing = await fetch('/search-index/parts.json', { method: 'GET' });
    if (!listing.ok) return;
    const { parts } = await listing.json();
    // Only paths on this site, as the build writes them.
    const paths = (Array.isArray(parts) ? parts : []).map((part) => part && part.path).filter((p) => typeof p === 'string' && /^\/search-index\/part-\d+\/$/.test(p));
    if (paths.length === 0) return;
    engine = await import(`${paths[0]}pagefind.js`);
    await engine.init();
    for (const more of paths.slice(1)) await engine.mergeIndex(more);
  } catch {
    return;
  }
  box.hidden = false;
  let latest = 0;
  input.addEventListener('input', async () => {
    const query = input.value.trim();
    const ticket = ++latest;
    results.replaceChildren();
    if (query.length < 2) {
      status.textContent = '';
      return;
    }
    const found = await engine.search(query);
    if (ticket !== latest || !found) return;
    const items = await Promise.all(found.results.slice(0, 12).map((r) => r.data()));
    if (ticket !== latest) return;
    status.textContent = items.length === 0 ? 'No segment or place matches.' : `${found.results.length} found`;
    for (const item of items) {
      const li = document.createElement('li');
      const a = document.createElement('a');
      const url = typeof item.url === 'string' && item.url.startsWith('/') && !item.url.startsWith('//') ? item.url : '/';
      a.href = url;
      a.textContent = (item.meta && item.meta.title) || url;
      li.append(a);
      results.append(li);
    }
  });
}

// An enhancement only: if the index cannot load, the plain list of segments stays as it is.
start().catch(() => {});
