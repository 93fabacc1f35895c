import { error, fail, isHttpError, redirect } from '@sveltejs/kit';
import { Op } from 'sequelize';
import { Sweep } from '$lib/server/db/models';
import { requireWorkspace } from '$lib/server/guard';
import * as catalogue from '$lib/server/catalogue';
import { ConflictError, InputError } from '$lib/server/sweeps/http';
import { QueueUnavailableError } from '$lib/server/sweeps/runner';
import { sweepAccess } from '$lib/server/sweeps/access';
import { createSweep } from '$lib/server/sweeps/service';
import { listStudies } from '$lib/server/sweeps/studies';
import { starterSpec, type StarterEntry as Entry } from '$lib/server/sweeps/starter';
import type { Actions, PageServerLoad } from './$types';

/** Largest spec the builder accepts (form field or uploaded file), in bytes. */
const MAX_SPEC_BYTES = 256 * 1024;

/**
 * Cases per second of this workspace's recent completed sweeps, per mode (the median of up to
 * ten), for the builder's time estimate; null for a mode with no history.
 */
async function recentRates(workspaceId: string): Promise<Record<'budget' | 'ascent', number | null>> {
  const rows = await Sweep.findAll({
    where: { workspaceId, status: 'completed', startedAt: { [Op.ne]: null }, finishedAt: { [Op.ne]: null } },
    order: [['finishedAt', 'DESC']],
    limit: 40,
    attributes: ['mode', 'doneCases', 'startedAt', 'finishedAt']
  });
  const out: Record<'budget' | 'ascent', number | null> = { budget: null, ascent: null };
  for (const mode of ['budget', 'ascent'] as const) {
    // Only sweeps long enough for start-up and ranking not to dominate their rate.
    const rates = rows
      .map((r) => ({ mode: r.mode, n: r.doneCases, s: (new Date(r.finishedAt!).getTime() - new Date(r.startedAt!).getTime()) / 1000 }))
      .filter((r) => r.mode === mode && r.s >= 5 && r.n >= (mode === 'ascent' ? 200 : 20_000))
      .slice(0, 10)
      .map((r) => r.n / r.s)
      .sort((a, b) => a - b);
    if (rates.length) out[mode] = rates[Math.floor(rates.length / 2)];
  }
  return out;
}

export const load: PageServerLoad = async ({ locals, params, url }) => {
  const access = await requireWorkspace(locals, { slug: params.workspace }, 'engineer');
  const rates = await recentRates(access.workspace.id);
  const [studies, entries] = await Promise.all([
    listStudies(locals, { workspace: access.workspace.id }),
    catalogue.list(access.workspace.id)
  ]);
  const choices: Entry[] = entries.map((e) => ({ id: String(e.id), name: e.name, ispSeaLevel: e.ispSeaLevelS ?? 0, ispVacuum: e.ispVacuumS }));
  let spec: unknown = starterSpec(choices);
  let clonedFrom: { id: number; name: string } | null = null;
  let studyId = url.searchParams.get('study') ?? '';
  const cloneRaw = url.searchParams.get('clone');
  if (cloneRaw) {
    if (!/^[1-9][0-9]{0,9}$/.test(cloneRaw)) error(404, 'Sweep not found');
    const { sweep } = await sweepAccess(locals, Number(cloneRaw));
    if (sweep.workspaceId !== access.workspace.id) error(404, 'Sweep not found');
    spec = structuredClone(sweep.spec);
    (spec as { name: string }).name = `${sweep.name} (copy)`.slice(0, 120);
    clonedFrom = { id: sweep.id, name: sweep.name };
    studyId ||= sweep.studyId;
  }
  if (!studies.some((s) => s.id === studyId)) studyId = studies[0]?.id ?? '';
  // A new sweep starts from its study's question.
  if (!clonedFrom) (spec as { question: string }).question = studies.find((s) => s.id === studyId)?.question ?? '';
  return {
    ...access,
    units: locals.user!.units,
    spec,
    clonedFrom,
    studyId,
    studies: studies.map((s) => ({ id: s.id, name: s.name })),
    catalogue: entries.map((e) => ({
      id: String(e.id),
      name: e.name,
      ispSeaLevel: e.ispSeaLevelS ?? 0,
      ispVacuum: e.ispVacuumS
    })),
    maxSpecBytes: MAX_SPEC_BYTES,
    rates
  };
};

export const actions: Actions = {
  create: async ({ locals, params, request }) => {
    await requireWorkspace(locals, { slug: params.workspace }, 'engineer');
    const form = await request.formData();
    const studyId = String(form.get('studyId') ?? '');
    const specText = String(form.get('spec') ?? '');
    const start = form.get('intent') !== 'draft';
    const values = { studyId, spec: specText };
    if (!studyId) return fail(400, { values, errors: { studyId: 'choose the study this sweep belongs to' } as Record<string, string> });
    if (specText.length > MAX_SPEC_BYTES)
      return fail(400, { values, errors: { _: `the specification is larger than ${MAX_SPEC_BYTES / 1024} KiB` } as Record<string, string> });
    let spec: unknown;
    try {
      spec = JSON.parse(specText);
    } catch {
      return fail(400, { values, errors: { _: 'the specification is not valid JSON' } as Record<string, string> });
    }
    let id: number;
    try {
      const sweep = await createSweep(locals, { studyId, spec, start });
      id = sweep.id;
    } catch (e) {
      if (e instanceof InputError) {
        // The service prefixes spec fields with "spec."; the form keys them by the spec path.
        const errors: Record<string, string> = {};
        for (const [k, v] of Object.entries(e.errors)) errors[k === 'spec' ? '_' : k.replace(/^spec\./, '')] = v;
        return fail(400, { values, errors });
      }
      if (e instanceof ConflictError) return fail(409, { values, errors: { studyId: e.message } as Record<string, string> });
      if (e instanceof QueueUnavailableError)
        return fail(503, { values, errors: { _: 'The job queue is unavailable right now; the sweep was kept as a draft. Try again shortly.' } as Record<string, string> });
      if (isHttpError(e) && e.status === 404) return fail(400, { values, errors: { studyId: 'that study does not exist here' } as Record<string, string> });
      throw e;
    }
    redirect(303, `/w/${params.workspace}/sweeps/${id}`);
  }
};
