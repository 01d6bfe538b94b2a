// Download: the whole bulletin model (JSON) for one segment and season, written at build time from the bulletin model.
import type { APIRoute } from 'astro';
import type { Bulletin } from '../../../../../generator/model/types.ts';
import { loadModel } from '../../../../lib/model.ts';
import { everyBulletinPath } from '../../../../lib/bulletin-view.ts';

export async function getStaticPaths() {
  return everyBulletinPath(await loadModel());
}

export const GET: APIRoute = ({ props }) => {
  const { bulletin } = props as { bulletin: Bulletin };
  return new Response(`${JSON.stringify(bulletin, null, 2)}\n`, { headers: { 'Content-Type': 'application/json; charset=utf-8' } });
};
