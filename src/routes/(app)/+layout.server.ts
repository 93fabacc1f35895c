import { redirect } from '@sveltejs/kit';
import { userWorkspaces } from '$lib/server/guard';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async ({ locals, url }) => {
  if (!locals.user) redirect(303, `/signin?next=${encodeURIComponent(url.pathname)}`);
  return { user: locals.user, workspaces: await userWorkspaces(locals.user.id) };
};
