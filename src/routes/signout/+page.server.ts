import { redirect } from '@sveltejs/kit';
import { invalidateSession } from '$lib/server/auth';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => redirect(303, '/');

export const actions: Actions = {
  default: async ({ locals, cookies }) => {
    if (locals.session) {
      const blank = await invalidateSession(locals.session.id);
      cookies.set(blank.name, blank.value, { path: '.', ...blank.attributes });
    }
    redirect(303, '/signin');
  }
};
