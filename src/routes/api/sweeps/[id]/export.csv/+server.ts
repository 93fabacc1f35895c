import { requireUser } from '$lib/server/guard';
import { sweepAccess } from '$lib/server/sweeps/access';
import { api, sweepIdParam } from '$lib/server/sweeps/http';
import { exportCsv } from '$lib/server/sweeps/results';
import type { RequestHandler } from './$types';

/** Every case as CSV, streamed page by page from the database. */
export const GET: RequestHandler = ({ locals, params }) =>
  api(async () => {
    requireUser(locals);
    const { sweep } = await sweepAccess(locals, sweepIdParam(params.id));
    const name = `sweep-${sweep.id}-${sweep.name.replace(/[^A-Za-z0-9_-]+/g, '-').slice(0, 60)}.csv`;
    return new Response(exportCsv(sweep), {
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': `attachment; filename="${name}"`,
        'cache-control': 'no-store'
      }
    });
  });
