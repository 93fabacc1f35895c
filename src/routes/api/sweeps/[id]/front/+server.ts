import { json } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guard';
import { sweepAccess } from '$lib/server/sweeps/access';
import { api, sweepIdParam } from '$lib/server/sweeps/http';
import { front } from '$lib/server/sweeps/results';
import type { RequestHandler } from './$types';

/** The Pareto front (rank 1), or while running the merged live front of the stored chunks. */
export const GET: RequestHandler = ({ locals, params }) =>
  api(async () => {
    requireUser(locals);
    const { sweep } = await sweepAccess(locals, sweepIdParam(params.id));
    return json(await front(sweep));
  });
