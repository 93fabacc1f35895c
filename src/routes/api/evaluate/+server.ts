import { json } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guard';
import { previewCase } from '$lib/server/sweeps/cases';
import { api, readJson } from '$lib/server/sweeps/http';
import type { RequestHandler } from './$types';

/** { spec, caseIndex? } → one case evaluated (nothing stored), for the builder's preview. */
export const POST: RequestHandler = ({ locals, request }) =>
  api(async () => {
    requireUser(locals);
    return json(previewCase(await readJson(request)));
  });
