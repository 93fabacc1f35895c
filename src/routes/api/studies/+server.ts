import { json } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guard';
import { api, readJson } from '$lib/server/sweeps/http';
import { createStudy, listStudies } from '$lib/server/sweeps/studies';
import type { RequestHandler } from './$types';

/** Studies of one workspace (?workspace=<id|slug>) or of all the user's; ?archived=1 includes archived ones. */
export const GET: RequestHandler = ({ locals, url }) =>
  api(async () => {
    requireUser(locals);
    const archived = url.searchParams.get('archived');
    return json({ studies: await listStudies(locals, { workspace: url.searchParams.get('workspace'), archived: archived === '1' || archived === 'true' }) });
  });

/** { workspaceId | workspace (slug), name, question?, notes? } → 201 (engineer+). */
export const POST: RequestHandler = ({ locals, request }) =>
  api(async () => {
    requireUser(locals);
    return json(await createStudy(locals, await readJson(request)), { status: 201 });
  });
