import { json } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guard';
import { createApiToken, listApiTokens } from '$lib/server/sweeps/api-tokens';
import { api, readJson } from '$lib/server/sweeps/http';
import type { RequestHandler } from './$types';

/** The user's live tokens (never the secret). */
export const GET: RequestHandler = ({ locals }) =>
  api(async () => {
    requireUser(locals);
    return json({ tokens: await listApiTokens(locals) });
  });

/** { name, expiresInDays? } → 201 { token, id, name, prefix, expiresAt, createdAt }; the token is shown once. */
export const POST: RequestHandler = ({ locals, request }) =>
  api(async () => {
    requireUser(locals);
    return json(await createApiToken(locals, await readJson(request)), { status: 201 });
  });
