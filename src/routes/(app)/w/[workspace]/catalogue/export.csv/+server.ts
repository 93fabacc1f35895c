import { requireWorkspace } from '$lib/server/guard';
import * as catalogue from '$lib/server/catalogue';
import { catalogueToCsv } from '$lib/catalogue/csv';
import type { RequestHandler } from './$types';

/** The workspace's catalogue as CSV in the import format (SI), for any member. */
export const GET: RequestHandler = async ({ locals, params }) => {
  const { workspace } = await requireWorkspace(locals, { slug: params.workspace });
  const csv = catalogueToCsv(await catalogue.list(workspace.id));
  return new Response(csv, {
    headers: {
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="${workspace.slug}-catalogue.csv"`,
      'cache-control': 'no-store'
    }
  });
};
