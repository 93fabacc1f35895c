import { requireUser } from '$lib/server/guard';
import { sweepAccess } from '$lib/server/sweeps/access';
import { api, sweepIdParam } from '$lib/server/sweeps/http';
import { exportCsv, parseCaseQuery } from '$lib/server/sweeps/results';
import type { RequestHandler } from './$types';

/**
 * The cases as CSV in case order, streamed page by page from the database: every case, or with
 * the filters of GET …/cases (feasible=1, rank=, min./max.<result>, min./max./is.param.<path>)
 * only the matching ones.
 */
export const GET: RequestHandler = ({ locals, params, url }) =>
  api(async () => {
    requireUser(locals);
    const filters = url.searchParams.size ? parseCaseQuery(url.searchParams) : null;
    const { sweep } = await sweepAccess(locals, sweepIdParam(params.id));
    const name = `sweep-${sweep.id}-${sweep.name.replace(/[^A-Za-z0-9_-]+/g, '-').slice(0, 60)}${filters ? '-filtered' : ''}.csv`;
    return new Response(exportCsv(sweep, filters), {
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        'content-disposition': `attachment; filename="${name}"`,
        'cache-control': 'no-store'
      }
    });
  });
