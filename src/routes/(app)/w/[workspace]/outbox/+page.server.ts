import { requireWorkspace } from '$lib/server/guard';
import * as outbox from '$lib/server/outbox';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
  const access = await requireWorkspace(locals, { slug: params.workspace }, 'admin');
  return { ...access, limit: outbox.OUTBOX_LIMIT, messages: await outbox.list(access.workspace.id) };
};
