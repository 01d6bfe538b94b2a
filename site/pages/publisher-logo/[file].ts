// The publisher's logo, copied byte for byte from the model folder under its content-addressed
// name (generator/model/publisher-logo.ts); no route at all when the settings give no logo.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { APIRoute, GetStaticPaths } from 'astro';
import { loadModel, modelDir } from '../../lib/model.ts';

const contentAddressed = /^[0-9a-f]{32}\.(png|jpg|webp)$/;

export const getStaticPaths = (async () => {
  const logo = (await loadModel()).site.publisherLogo;
  if (!logo) return [];
  if (!contentAddressed.test(logo.file)) throw new Error(`publisher logo "${logo.file}" is not a content-addressed file name`);
  return [{ params: { file: logo.file }, props: { mediaType: logo.mediaType } }];
}) satisfies GetStaticPaths;

export const GET: APIRoute = ({ params, props }) => {
  const file = String(params['file']);
  if (!contentAddressed.test(file)) throw new Error(`publisher logo "${file}" is not a content-addressed file name`);
  const bytes = readFileSync(join(modelDir(), 'publisher-logo', file));
  return new Response(bytes, { headers: { 'Content-Type': (props as { mediaType: string }).mediaType } });
};
