import { reportData } from '$lib/server/report';
import { sweepForPage } from '../sweep.server';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
  const { sweep, workspace, role } = await sweepForPage(locals, params);
  return { workspace, role, units: locals.user!.units, report: await reportData(sweep) };
};
