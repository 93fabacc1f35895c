import { json } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guard';
import { api, readJson } from '$lib/server/sweeps/http';
import { getStudy, updateStudy } from '$lib/server/sweeps/studies';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ locals, params }) =>
  api(async () => {
    requireUser(locals);
    return json(await getStudy(locals, params.id));
  });

/** { name?, question?, notes?, archived? } (engineer+). */
export const PATCH: RequestHandler = ({ locals, params, request }) =>
  api(async () => {
    requireUser(locals);
    return json(await updateStudy(locals, params.id, await readJson(request)));
  });
