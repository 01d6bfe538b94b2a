/**
 * Step: render (pages and downloads side by side).
 * The site's files for a model folder: Astro's pages (astro-render.ts) and, written at the same
 * time by this process, the data downloads of each bulletin (write-downloads.ts). The downloads
 * go to a folder of their own first and are moved in once Astro has finished, so the two never
 * write into one folder at once.
 */
import { mkdir, readFile, rm } from 'node:fs/promises';
import path from 'node:path';
import { modelBulletinIds, renderWithAstro, type RenderOptions } from './astro-render.ts';
import { moveFiles } from '../move-files.ts';
import { writeDownloads } from './write-downloads.ts';

/** `pages` counts Astro's pages and the download files. */
export async function renderSite(options: RenderOptions): Promise<{ pages: number }> {
  const ids = options.only === undefined ? await modelBulletinIds(options.modelDir) : (JSON.parse(await readFile(options.only, 'utf8')) as string[]);
  const staging = `${path.resolve(options.outDir)}.downloads`;
  await rm(staging, { recursive: true, force: true });
  await mkdir(staging, { recursive: true });
  try {
    const [rendered, downloads] = await Promise.all([renderWithAstro(options), writeDownloads(options.modelDir, staging, ids)]);
    await moveFiles(staging, options.outDir);
    return { pages: rendered.pages + downloads };
  } finally {
    await rm(staging, { recursive: true, force: true, maxRetries: 3 });
  }
}
