/**
 * Role guard used by every protected page load, form action and API route.
 * Anonymous → 401 (API) or a redirect to sign-in (pages, handled in hooks.server.ts);
 * signed in without the role → 403; a workspace the user is not a member of → 404,
 * so another workspace's existence is never revealed.
 */
import { error } from '@sveltejs/kit';
import { Membership, Workspace, roleAtLeast, type Role } from './db/models';

export interface WorkspaceAccess {
  workspace: { id: string; name: string; slug: string; description: string };
  role: Role;
}

export function requireUser(locals: App.Locals) {
  if (!locals.user) error(401, 'Sign in required');
  return locals.user;
}

/** Resolves a workspace by id or slug for the signed-in user and checks the role. */
export async function requireWorkspace(
  locals: App.Locals,
  ref: { id?: string; slug?: string },
  need: Role = 'viewer'
): Promise<WorkspaceAccess> {
  const user = requireUser(locals);
  const where = ref.id ? { id: ref.id } : { slug: ref.slug ?? '' };
  const ws = await Workspace.findOne({ where });
  const m = ws ? await Membership.findOne({ where: { workspaceId: ws.id, userId: user.id } }) : null;
  if (!ws || !m) error(404, 'Workspace not found');
  if (!roleAtLeast(m.role, need)) error(403, `This needs the ${need} role in ${ws.name}`);
  return {
    workspace: { id: ws.id, name: ws.name, slug: ws.slug, description: ws.description },
    role: m.role
  };
}

/** Workspaces of a user, with the role in each, for the switcher and the dashboard. */
export async function userWorkspaces(userId: string) {
  const rows = await Membership.findAll({
    where: { userId },
    include: [{ model: Workspace, as: 'workspace' }],
    order: [['createdAt', 'ASC']]
  });
  return rows.map((m) => {
    const ws = (m as Membership & { workspace: Workspace }).workspace;
    return { id: ws.id, name: ws.name, slug: ws.slug, description: ws.description, role: m.role };
  });
}
