import { caseDetail, caseIndexParam } from '$lib/server/sweeps/cases';
import { sweepView } from '$lib/server/sweeps/service';
import { sweepForPage } from '../../sweep.server';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
  const { sweep, workspace, role } = await sweepForPage(locals, params);
  const index = caseIndexParam(params.index, sweep.totalCases);
  const v = sweepView(sweep, { spec: true });
  return {
    workspace,
    role,
    units: locals.user!.units,
    sweep: { id: v.id, name: v.name, status: v.status, total: v.counts.total, modelVersion: v.modelVersion, spec: v.spec! },
    detail: await caseDetail(sweep, index)
  };
};
