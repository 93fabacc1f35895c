import { json } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guard';
import { api, sweepIdParam } from '$lib/server/sweeps/http';
import { deleteSweep, getSweep } from '$lib/server/sweeps/service';
import type { RequestHandler } from './$types';

/** Status, counts, progress, ETA, summary and the frozen spec. */
export const GET: RequestHandler = ({ locals, params }) =>
  api(async () => {
    requireUser(locals);
    return json(await getSweep(locals, sweepIdParam(params.id)));
  });

export const DELETE: RequestHandler = ({ locals, params }) =>
  api(async () => {
    requireUser(locals);
    return json(await deleteSweep(locals, sweepIdParam(params.id)));
  });
