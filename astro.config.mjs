// Astro renders the bulletin model (written by generator/) into a static site.
// The model folder and the output folder are passed by `wrackline build` through
// WRACKLINE_MODEL and --outDir; nothing here computes statistics or wording.
import { readFile, unlink } from 'node:fs/promises';
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'astro/config';

/**
 * Astro 5 leaves two empty content-layer modules in the output folder when --outDir lies
 * outside the project (withastro/astro issue 14903). They are not part of the site: remove
 * them after the build, but only when they hold nothing but an empty Map.
 */
function dropEmptyContentStubs() {
  return {
    name: 'wrackline-drop-empty-content-stubs',
    hooks: {
      'astro:build:done': async ({ dir }) => {
        for (const name of ['content-assets.mjs', 'content-modules.mjs']) {
          const file = fileURLToPath(new URL(name, dir));
          const text = await readFile(file, 'utf8').catch(() => null);
          if (text !== null && /^\s*export default new Map\(?\)?;?\s*$/.test(text)) await unlink(file);
        }
      },
    },
  };
}

export default defineConfig({
  srcDir: './site',
  publicDir: './public',
  outDir: './dist',
  output: 'static',
  trailingSlash: 'always',
  // Stylesheets stay external files: pages carry no inline <style> from Astro and the
  // Content-Security-Policy needs no exception for them. No client scripts are bundled.
  build: { format: 'directory', inlineStylesheets: 'never' },
  devToolbar: { enabled: false },
  compressHTML: true,
  integrations: [dropEmptyContentStubs()],
  vite: { logLevel: 'warn' },
});
