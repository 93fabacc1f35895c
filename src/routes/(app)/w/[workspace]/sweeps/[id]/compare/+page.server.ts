import { caseDetail } from '$lib/server/sweeps/cases';
import { sweepView } from '$lib/server/sweeps/service';
import { sweepForPage } from '../sweep.server';
import type { PageServerLoad } from './$types';

/** Up to 4 cases side by side: ?i=3,17,42 (unknown or repeated indexes are dropped and reported). */
export const load: PageServerLoad = async ({ locals, params, url }) => {
  const { sweep, workspace, role } = await sweepForPage(locals, params);
  const raw = (url.searchParams.get('i') ?? '').split(',').map((s) => s.trim()).filter(Boolean);
  const indexes: number[] = [];
  const dropped: string[] = [];
  for (const r of raw) {
    const n = /^(0|[1-9][0-9]{0,9})$/.test(r) ? Number(r) : NaN;
    if (!Number.isInteger(n) || n >= sweep.totalCases || indexes.includes(n) || indexes.length >= 4) dropped.push(r);
    else indexes.push(n);
  }
  const v = sweepView(sweep, { spec: true });
  return {
    workspace,
    role,
    units: locals.user!.units,
    sweep: { id: v.id, name: v.name, total: v.counts.total, spec: v.spec! },
    dropped,
    cases: await Promise.all(indexes.map((i) => caseDetail(sweep, i)))
  };
};
