import { error } from '@sveltejs/kit';
import { requireWorkspace } from '$lib/server/guard';
import * as outbox from '$lib/server/outbox';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
  const access = await requireWorkspace(locals, { slug: params.workspace }, 'admin');
  // Another workspace's message answers like a missing one.
  const message = await outbox.read(access.workspace.id, Number(params.id));
  if (!message) error(404, 'Message not found');
  return { ...access, message };
};
