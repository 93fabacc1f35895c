import { json } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guard';
import { api, sweepIdParam } from '$lib/server/sweeps/http';
import { resumeSweep } from '$lib/server/sweeps/service';
import type { RequestHandler } from './$types';

/** Resume the sweep (engineer+); 409 when its state does not allow it. */
export const POST: RequestHandler = ({ locals, params }) =>
  api(async () => {
    requireUser(locals);
    return json(await resumeSweep(locals, sweepIdParam(params.id)));
  });
