import { json } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guard';
import { api, readJson } from '$lib/server/sweeps/http';
import { createSweep, listSweeps } from '$lib/server/sweeps/service';
import type { RequestHandler } from './$types';

/** Sweeps of the user's workspaces; ?workspace=<id|slug>&studyId=&status=&limit=&offset=. */
export const GET: RequestHandler = ({ locals, url }) =>
  api(async () => {
    requireUser(locals);
    return json(await listSweeps(locals, url.searchParams));
  });

/** Create a sweep in a study and queue it: { studyId, spec, start? } → 201 (engineer+). */
export const POST: RequestHandler = ({ locals, request }) =>
  api(async () => {
    requireUser(locals);
    return json(await createSweep(locals, await readJson(request)), { status: 201 });
  });
