import { requireWorkspace } from '$lib/server/guard';
import { Membership, User } from '$lib/server/db/models';
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
  return { ...access, members };
};
