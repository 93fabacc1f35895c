import { json } from '@sveltejs/kit';
import { requireWorkspace } from '$lib/server/guard';
import * as catalogue from '$lib/server/catalogue';
import type { RequestHandler } from './$types';

/**
 * The workspace's propulsion catalogue for the sweep builder and scripts, in SI:
 * { entries: [{ id, name, propellants, ispSeaLevelS (null: vacuum only), ispVacuumS,
 *   thrustVacuumN, massKg, notes, createdAt, updatedAt }] }. Any member may read it.
 */
export const GET: RequestHandler = async ({ locals, params }) => {
  const { workspace } = await requireWorkspace(locals, { id: params.id });
  const entries = await catalogue.list(workspace.id);
  return json({ workspaceId: workspace.id, entries: entries.map(({ workspaceId: _w, ...e }) => e) });
};
