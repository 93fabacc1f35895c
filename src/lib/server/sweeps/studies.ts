/** Studies: list, create, update (rename, question, notes, archive). */
import { z } from 'zod';
import { Study } from '../db/models';
import { requireWorkspace, userWorkspaces } from '../guard';
import { studyAccess } from './access';
import { InputError, isUuid, parseOr400 } from './http';
import { Op } from 'sequelize';

export const studyCreateSchema = z
  .object({
    workspaceId: z.string().uuid('workspaceId must be a workspace id').optional(),
    workspace: z.string().min(1).max(64).optional(),
    name: z.string().trim().min(1, 'the study needs a name').max(120, 'name must be at most 120 characters'),
    question: z.string().trim().max(2000, 'question must be at most 2000 characters').default(''),
    notes: z.string().max(20_000, 'notes must be at most 20,000 characters').default('')
  })
  .strict();

export const studyPatchSchema = z
  .object({
    name: z.string().trim().min(1, 'the study needs a name').max(120, 'name must be at most 120 characters').optional(),
    question: z.string().trim().max(2000, 'question must be at most 2000 characters').optional(),
    notes: z.string().max(20_000, 'notes must be at most 20,000 characters').optional(),
    archived: z.boolean({ error: 'archived must be true or false' }).optional()
  })
  .strict();

export function studyView(s: Study) {
  return {
    id: s.id,
    workspaceId: s.workspaceId,
    name: s.name,
    question: s.question,
    notes: s.notes,
    archived: s.archived,
    createdBy: s.createdBy,
    createdAt: s.createdAt,
    updatedAt: s.updatedAt
  };
}
export type StudyView = ReturnType<typeof studyView>;

/** Studies of one workspace (`workspace` = id or slug) or of every workspace of the user. */
export async function listStudies(locals: App.Locals, q: { workspace?: string | null; archived?: boolean }) {
  let ids: string[];
  if (q.workspace) {
    const ref = isUuid(q.workspace) ? { id: q.workspace } : { slug: q.workspace };
    ids = [(await requireWorkspace(locals, ref)).workspace.id];
  } else {
    if (!locals.user) return [];
    ids = (await userWorkspaces(locals.user.id)).map((w) => w.id);
  }
  const rows = await Study.findAll({
    where: { workspaceId: { [Op.in]: ids }, ...(q.archived ? {} : { archived: false }) },
    order: [['updatedAt', 'DESC']],
    limit: 500
  });
  return rows.map(studyView);
}

export async function createStudy(locals: App.Locals, body: unknown) {
  const input = parseOr400(studyCreateSchema, body);
  const ref = input.workspaceId ? { id: input.workspaceId } : input.workspace ? { slug: input.workspace } : null;
  if (!ref) throw new InputError('Invalid input', { workspaceId: 'give the workspace (workspaceId or workspace slug)' });
  const { workspace } = await requireWorkspace(locals, ref, 'engineer');
  const s = await Study.create({
    workspaceId: workspace.id,
    name: input.name,
    question: input.question,
    notes: input.notes,
    createdBy: locals.user!.id
  });
  return studyView(s);
}

export async function getStudy(locals: App.Locals, id: string) {
  const { study, role } = await studyAccess(locals, id);
  return { ...studyView(study), role };
}

export async function updateStudy(locals: App.Locals, id: string, body: unknown) {
  const input = parseOr400(studyPatchSchema, body);
  const { study } = await studyAccess(locals, id, 'engineer');
  await study.update(input);
  return studyView(study);
}
