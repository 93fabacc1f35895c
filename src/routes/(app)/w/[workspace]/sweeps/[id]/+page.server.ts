import { fail, redirect } from '@sveltejs/kit';
import { Study } from '$lib/server/db/models';
import { deleteSweep, sweepView } from '$lib/server/sweeps/service';
import { ConflictError } from '$lib/server/sweeps/http';
import { createShareLink, listShareLinks, revokeShareLink, SHARE_EXPIRY_DAYS } from '$lib/server/share-links';
import { parseShareLinkForm } from '$lib/schemas/share';
import { UNIT_SYSTEM_LABELS, UNIT_SYSTEMS } from '$lib/units';
import { sweepForPage } from './sweep.server';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
  const { sweep, workspace, role } = await sweepForPage(locals, params);
  const [study, links] = await Promise.all([
    Study.findByPk(sweep.studyId),
    role === 'viewer' ? Promise.resolve([]) : listShareLinks(sweep.id)
  ]);
  return {
    workspace,
    role,
    units: locals.user!.units,
    sweep: sweepView(sweep, { spec: true }),
    study: study ? { id: study.id, name: study.name } : null,
    shareLinks: links,
    // The owner or an admin may delete it (once it is not queued or running; the server checks).
    canDelete: role === 'admin' || (role === 'engineer' && sweep.ownerId === locals.user!.id),
    expiryChoices: SHARE_EXPIRY_DAYS,
    unitChoices: UNIT_SYSTEMS.map((value) => ({ value, label: UNIT_SYSTEM_LABELS[value] }))
  };
};

export const actions: Actions = {
  share: async ({ locals, params, request, url }) => {
    const { sweep } = await sweepForPage(locals, params, 'engineer');
    // Units left out default to the creator's own display units.
    const parsed = parseShareLinkForm(await request.formData(), locals.user!.units);
    if (!parsed.ok) return fail(400, { share: { values: parsed.values, errors: parsed.errors } });
    const { label, days, units } = parsed.data;
    const { token, link } = await createShareLink(sweep.id, locals.user!.id, label || `Report of ${sweep.name}`.slice(0, 120), days, units);
    // The token is shown once: only its hash is stored.
    return { created: { ...link, url: `${url.origin}/share/${token}` } };
  },
  delete: async ({ locals, params }) => {
    const { sweep, workspace } = await sweepForPage(locals, params, 'engineer');
    try {
      await deleteSweep(locals, sweep.id);
    } catch (e) {
      if (e instanceof ConflictError) return fail(409, { deleteError: e.message });
      throw e;
    }
    redirect(303, `/w/${workspace.slug}/studies/${sweep.studyId}?deleted=${encodeURIComponent(sweep.name)}`);
  },
  revoke: async ({ locals, params, request }) => {
    const { sweep } = await sweepForPage(locals, params, 'engineer');
    const id = Number((await request.formData()).get('linkId'));
    if (!Number.isInteger(id) || id < 1) return fail(400, { revoke: { error: 'unknown share link' } });
    const ok = await revokeShareLink(sweep.id, id);
    if (!ok) return fail(404, { revoke: { error: 'that share link is not on this sweep' } });
    return { revoked: id };
  }
};
