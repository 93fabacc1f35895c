/**
 * Loads a sweep for a page under /w/[workspace]/sweeps/[id]: the workspace from the URL must
 * be the sweep's own (else 404, like an unknown id), the role checked by sweepAccess.
 */
import { error } from '@sveltejs/kit';
import type { Role } from '$lib/server/db/models';
import { sweepAccess } from '$lib/server/sweeps/access';
import { sweepIdParam } from '$lib/server/sweeps/http';

export async function sweepForPage(locals: App.Locals, params: { workspace: string; id: string }, role: Role = 'viewer') {
  const a = await sweepAccess(locals, sweepIdParam(params.id), role);
  if (a.workspace.slug !== params.workspace) error(404, 'Sweep not found');
  return a;
}
