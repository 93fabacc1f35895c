import { requireWorkspace } from '$lib/server/guard';
import { Membership, Study, Sweep, User } from '$lib/server/db/models';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, params }) => {
  const access = await requireWorkspace(locals, { slug: params.workspace });
  const rows = await Membership.findAll({
    where: { workspaceId: access.workspace.id },
    include: [{ model: User, as: 'user', attributes: ['id', 'email', 'displayName'] }],
    order: [['role', 'DESC']]
  });
  const members = rows.map((m) => {
    const u = (m as Membership & { user: User }).user;
    return { id: u.id, email: u.email, displayName: u.displayName, role: m.role };
  });
  // Recent sweeps of the workspace, for the sweeps section.
  const recent = await Sweep.findAll({ where: { workspaceId: access.workspace.id }, order: [['createdAt', 'DESC']], limit: 8 });
  const studyNames = new Map(
    (await Study.findAll({ where: { workspaceId: access.workspace.id }, attributes: ['id', 'name'] })).map((s) => [s.id, s.name])
  );
  const sweeps = recent.map((s) => ({
    id: s.id,
    name: s.name,
    status: s.status,
    study: studyNames.get(s.studyId) ?? '',
    total: s.totalCases,
    feasible: s.feasibleCases,
    createdAt: new Date(s.createdAt).toISOString()
  }));
  return { ...access, members, sweeps, studyCount: studyNames.size };
};
