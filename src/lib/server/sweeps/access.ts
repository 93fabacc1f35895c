/**
 * Access to one study or sweep by id: unknown ids and other workspaces' ids are the same
 * 404, so existence never leaks; a member without the role gets 403 (guard.ts).
 */
import { error, isHttpError } from '@sveltejs/kit';
import { Study, Sweep, type Role } from '../db/models';
import { requireWorkspace, type WorkspaceAccess } from '../guard';

async function inWorkspace(locals: App.Locals, workspaceId: string, role: Role, what: string): Promise<WorkspaceAccess> {
  try {
    return await requireWorkspace(locals, { id: workspaceId }, role);
  } catch (e) {
    if (isHttpError(e) && e.status === 404) error(404, `${what} not found`);
    throw e;
  }
}

export async function studyAccess(locals: App.Locals, studyId: string, role: Role = 'viewer') {
  const study = /^[0-9a-f-]{36}$/i.test(studyId) ? await Study.findByPk(studyId) : null;
  if (!study) {
    if (!locals.user) error(401, 'Sign in required');
    error(404, 'Study not found');
  }
  const access = await inWorkspace(locals, study.workspaceId, role, 'Study');
  return { study, ...access };
}

export async function sweepAccess(locals: App.Locals, sweepId: number, role: Role = 'viewer') {
  const sweep = await Sweep.findByPk(sweepId);
  if (!sweep) {
    if (!locals.user) error(401, 'Sign in required');
    error(404, 'Sweep not found');
  }
  const access = await inWorkspace(locals, sweep.workspaceId, role, 'Sweep');
  return { sweep, ...access };
}
