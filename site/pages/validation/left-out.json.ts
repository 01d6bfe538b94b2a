// Every record left out of the bulletins, with the reason, as data (the "Data checks" page lists
// the same records). `wrackline review` compares two releases' lists.
import type { APIRoute } from 'astro';
import { loadModel } from '../../lib/model.ts';

export const GET: APIRoute = async () => {
  const model = await loadModel();
  const records = model.site.validation.issues
    .filter((issue) => issue.excluded)
    .map((issue) => ({
      file: issue.file,
      row: issue.row,
      column: issue.column,
      value: issue.value,
      message: issue.message,
      expected: issue.expected,
      ...(issue.code === undefined ? {} : { code: issue.code }),
    }));
  return new Response(`${JSON.stringify({ invented: model.site.invented, records }, null, 1)}\n`, {
    headers: { 'Content-Type': 'application/json; charset=utf-8' },
  });
};
