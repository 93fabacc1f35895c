import { error, json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireWorkspace } from '$lib/server/guard';
import { Workspace } from '$lib/server/db/models';
import type { RequestHandler } from './$types';

const Patch = z
  .object({
    name: z.string().trim().min(1, 'Name is required').max(120).optional(),
    description: z.string().max(4000).optional()
  })
  .strict();

export const GET: RequestHandler = async ({ locals, params }) => {
  const { workspace, role } = await requireWorkspace(locals, { id: params.id });
  return json({ ...workspace, role });
};

/** Rename a workspace or change its description (admins only). */
export const PATCH: RequestHandler = async ({ locals, params, request }) => {
  const { workspace } = await requireWorkspace(locals, { id: params.id }, 'admin');
  const body = await request.json().catch(() => error(400, 'Body must be JSON'));
  const parsed = Patch.safeParse(body);
  if (!parsed.success) {
    return json(
      { message: 'Invalid input', errors: Object.fromEntries(parsed.error.issues.map((i) => [i.path.join('.') || 'body', i.message])) },
      { status: 400 }
    );
  }
  await Workspace.update(parsed.data, { where: { id: workspace.id } });
  return json({ ...workspace, ...parsed.data });
};
