import { json } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guard';
import { revokeApiToken } from '$lib/server/sweeps/api-tokens';
import { api } from '$lib/server/sweeps/http';
import type { RequestHandler } from './$types';

/** Revokes one of the user's own tokens; someone else's or an unknown id is a 404. */
export const DELETE: RequestHandler = ({ locals, params }) =>
  api(async () => {
    requireUser(locals);
    return json(await revokeApiToken(locals, params.id));
  });
