// Download: trend results per indicator (CSV) for one segment and season, written at build time from the bulletin model.
import type { APIRoute } from 'astro';
import type { Bulletin } from '../../../../../generator/model/types.ts';
import { loadModel } from '../../../../lib/model.ts';
import { everyBulletinPath } from '../../../../lib/bulletin-view.ts';
import { resultsCsv } from '../../../../lib/csv.ts';
export async function getStaticPaths() {
  return everyBulletinPath(await loadModel());
}

export const GET: APIRoute = ({ props }) => {
  const { bulletin } = props as { bulletin: Bulletin };
  return new Response(resultsCsv(bulletin), { headers: { 'Content-Type': 'text/csv; charset=utf-8' } });
};
