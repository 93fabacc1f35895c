import { json } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guard';
import { sweepAccess } from '$lib/server/sweeps/access';
import { caseDetail, caseIndexParam } from '$lib/server/sweeps/cases';
import { api, sweepIdParam } from '$lib/server/sweeps/http';
import type { RequestHandler } from './$types';

/** One case in full: the stored row and the case re-evaluated (budget terms, stage masses, reasons). */
export const GET: RequestHandler = ({ locals, params }) =>
  api(async () => {
    requireUser(locals);
    const { sweep } = await sweepAccess(locals, sweepIdParam(params.id));
    return json(await caseDetail(sweep, caseIndexParam(params.index, sweep.totalCases)));
  });
