import { fail, redirect } from '@sveltejs/kit';
import { requireWorkspace } from '$lib/server/guard';
import { Sweep } from '$lib/server/db/models';
import { InputError } from '$lib/server/sweeps/http';
import { createStudy, listStudies } from '$lib/server/sweeps/studies';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params, url }) => {
  const access = await requireWorkspace(locals, { slug: params.workspace });
  const archived = url.searchParams.get('archived') === '1';
  const studies = await listStudies(locals, { workspace: access.workspace.id, archived });
  const counts = new Map<string, number>();
  if (studies.length) {
    const rows = (await Sweep.count({ where: { workspaceId: access.workspace.id }, group: ['studyId'] })) as unknown as {
      studyId: string;
      count: number;
    }[];
    for (const r of rows) counts.set(r.studyId, Number(r.count));
  }
  return {
    ...access,
    archived,
    studies: studies.map((s) => ({
      id: s.id,
      name: s.name,
      question: s.question,
      archived: s.archived,
      updatedAt: new Date(s.updatedAt).toISOString(),
      sweeps: counts.get(s.id) ?? 0
    }))
  };
};

export const actions: Actions = {
  create: async ({ locals, params, request }) => {
    const form = await request.formData();
    const values = { name: String(form.get('name') ?? ''), question: String(form.get('question') ?? '') };
    let id: string;
    try {
      const s = await createStudy(locals, { workspace: params.workspace, ...values });
      id = s.id;
    } catch (e) {
      if (e instanceof InputError) return fail(400, { values, errors: e.errors });
      throw e;
    }
    redirect(303, `/w/${params.workspace}/studies/${id}`);
  }
};
