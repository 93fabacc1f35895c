import { json } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guard';
import { sweepAccess } from '$lib/server/sweeps/access';
import { api, sweepIdParam } from '$lib/server/sweeps/http';
import { casePage, parseCaseQuery } from '$lib/server/sweeps/results';
import type { RequestHandler } from './$types';

/**
 * A sorted, filtered page: ?sort=glow&dir=asc&limit=50&offset=0|after=<next>&feasible=1&rank=1&min.glow=&max.dryMass=
 * &min.param.<path>=&max.param.<path>= (swept numbers) &is.param.<path>=<entry ids> (catalogue choices)
 */
export const GET: RequestHandler = ({ locals, params, url }) =>
  api(async () => {
    requireUser(locals);
    const q = parseCaseQuery(url.searchParams);
    const { sweep } = await sweepAccess(locals, sweepIdParam(params.id));
    return json(await casePage(sweep, q));
  });
