import { fail, redirect } from '@sveltejs/kit';
import { errorsOf } from '$lib/schemas/errors';
import { z } from 'zod';
import { requireWorkspace } from '$lib/server/guard';
import { Workspace } from '$lib/server/db/models';
import type { Actions, PageServerLoad } from './$types';

const WorkspaceForm = z.object({
  name: z.string().trim().min(1, 'Enter a name').max(120, 'The name must be at most 120 characters'),
  description: z.string().trim().max(4000, 'Notes must be at most 4000 characters')
});

export const load: PageServerLoad = async ({ locals, params, url }) => {
  const access = await requireWorkspace(locals, { slug: params.workspace }, 'admin');
  return { ...access, saved: url.searchParams.has('saved') };
};

export const actions: Actions = {
  default: async ({ locals, params, request }) => {
    const { workspace } = await requireWorkspace(locals, { slug: params.workspace }, 'admin');
    const form = await request.formData();
    const values = { name: String(form.get('name') ?? ''), description: String(form.get('description') ?? '') };
    const parsed = WorkspaceForm.safeParse(values);
    if (!parsed.success) {
      const errors = errorsOf(parsed.error.issues);
      return fail(400, { values, errors });
    }
    await Workspace.update(parsed.data, { where: { id: workspace.id } });
    redirect(303, `/w/${workspace.slug}/settings?saved`);
  }
};
