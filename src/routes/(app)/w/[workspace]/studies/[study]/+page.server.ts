import { error, fail } from '@sveltejs/kit';
import { requireWorkspace } from '$lib/server/guard';
import { Sweep } from '$lib/server/db/models';
import { InputError, isUuid } from '$lib/server/sweeps/http';
import { sweepView } from '$lib/server/sweeps/service';
import { getStudy, updateStudy } from '$lib/server/sweeps/studies';
import type { Actions, PageServerLoad } from './$types';

async function studyIn(locals: App.Locals, slug: string, id: string) {
  const access = await requireWorkspace(locals, { slug });
  if (!isUuid(id)) error(404, 'Study not found');
  const study = await getStudy(locals, id);
  if (study.workspaceId !== access.workspace.id) error(404, 'Study not found');
  return { access, study };
}

export const load: PageServerLoad = async ({ locals, params }) => {
  const { access, study } = await studyIn(locals, params.workspace, params.study);
  const rows = await Sweep.findAll({ where: { studyId: study.id }, order: [['createdAt', 'DESC']], limit: 200 });
  return {
    ...access,
    study: { id: study.id, name: study.name, question: study.question, notes: study.notes, archived: study.archived },
    sweeps: rows.map((s) => {
      const v = sweepView(s);
      return { id: v.id, name: v.name, status: v.status, mode: v.mode, counts: v.counts, progress: v.progress, createdAt: v.createdAt };
    })
  };
};

export const actions: Actions = {
  update: async ({ locals, params, request }) => {
    const { study } = await studyIn(locals, params.workspace, params.study);
    const form = await request.formData();
    const values = {
      name: String(form.get('name') ?? ''),
      question: String(form.get('question') ?? ''),
      notes: String(form.get('notes') ?? '')
    };
    try {
      await updateStudy(locals, study.id, values);
    } catch (e) {
      if (e instanceof InputError) return fail(400, { values, errors: e.errors });
      throw e;
    }
    return { saved: true };
  },
  archive: async ({ locals, params, request }) => {
    const { study } = await studyIn(locals, params.workspace, params.study);
    const archived = (await request.formData()).get('archived') === '1';
    await updateStudy(locals, study.id, { archived });
    return { saved: true };
  }
};
