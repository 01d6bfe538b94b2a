// Astro renders the bulletin model (written by generator/) into a static site.
// The model folder and the output folder are passed by `wrackline build` through
// WRACKLINE_MODEL and --outDir; nothing here computes statistics or wording.
import { defineConfig } from 'astro/config';

export default defineConfig({
  srcDir: './site',
  publicDir: './public',
  outDir: './dist',
  output: 'static',
  trailingSlash: 'always',
  build: { format: 'directory', inlineStylesheets: 'never' },
  devToolbar: { enabled: false },
  compressHTML: true,
  vite: { logLevel: 'warn' },
});
