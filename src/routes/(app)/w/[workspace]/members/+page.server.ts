import { error, fail, redirect } from '@sveltejs/kit';
import { errorsOf } from '$lib/schemas/errors';
import { z } from 'zod';
import { requireWorkspace } from '$lib/server/guard';
import { ROLES } from '$lib/server/db/models';
import * as people from '$lib/server/people';
import type { Actions, PageServerLoad } from './$types';

const InviteForm = z.object({
  email: z.string().trim().min(1, 'Enter an e-mail address').max(254).email('Enter a valid e-mail address'),
  role: z.enum(ROLES, { error: 'Choose a role' })
});

export const load: PageServerLoad = async ({ locals, params, url }) => {
  const access = await requireWorkspace(locals, { slug: params.workspace }, 'admin');
  const [members, invites] = await Promise.all([
    people.listMembers(access.workspace.id),
    people.listInvites(access.workspace.id)
  ]);
  return { ...access, members, invites, me: locals.user!.id, notice: url.searchParams.get('done') };
};

function userIdOf(form: FormData) {
  const id = form.get('userId');
  if (typeof id !== 'string' || !/^[0-9a-f-]{36}$/i.test(id)) error(400, 'Member id missing');
  return id;
}

/** A refusal from the people module becomes a 400/409 beside the form it came from. */
function refusal(e: unknown, action: string, extra: Record<string, unknown> = {}) {
  if (e instanceof people.PeopleError) {
    return fail(e.status === 503 ? 503 : e.status === 409 ? 409 : 400, { action, ...extra, errors: { [e.field]: e.message } });
  }
  throw e;
}

export const actions: Actions = {
  invite: async ({ locals, params, request }) => {
    const { workspace } = await requireWorkspace(locals, { slug: params.workspace }, 'admin');
    const form = Object.fromEntries(await request.formData());
    const values = { email: String(form.email ?? ''), role: String(form.role ?? '') };
    const parsed = InviteForm.safeParse(form);
    if (!parsed.success) {
      const errors = errorsOf(parsed.error.issues);
      return fail(400, { action: 'invite', values, errors });
    }
    try {
      await people.createInvite({ workspaceId: workspace.id, email: parsed.data.email, role: parsed.data.role, invitedBy: locals.user! });
    } catch (e) {
      return refusal(e, 'invite', { values });
    }
    redirect(303, `/w/${workspace.slug}/members?done=invited`);
  },

  changeRole: async ({ locals, params, request }) => {
    const { workspace } = await requireWorkspace(locals, { slug: params.workspace }, 'admin');
    const form = await request.formData();
    const userId = userIdOf(form);
    const role = z.enum(ROLES).safeParse(form.get('role'));
    if (!role.success) return fail(400, { action: 'changeRole', userId, errors: { role: 'Choose a role' } });
    try {
      await people.changeRole(workspace.id, userId, role.data);
    } catch (e) {
      return refusal(e, 'changeRole', { userId });
    }
    // Demoting yourself ends your access to this page.
    if (userId === locals.user!.id && role.data !== 'admin') redirect(303, `/w/${workspace.slug}`);
    redirect(303, `/w/${workspace.slug}/members?done=role`);
  },

  remove: async ({ locals, params, request }) => {
    const { workspace } = await requireWorkspace(locals, { slug: params.workspace }, 'admin');
    const userId = userIdOf(await request.formData());
    try {
      await people.removeMember(workspace.id, userId);
    } catch (e) {
      return refusal(e, 'remove', { userId });
    }
    if (userId === locals.user!.id) redirect(303, '/');
    redirect(303, `/w/${workspace.slug}/members?done=removed`);
  },

  revokeInvite: async ({ locals, params, request }) => {
    const { workspace } = await requireWorkspace(locals, { slug: params.workspace }, 'admin');
    const id = Number((await request.formData()).get('inviteId'));
    if (!Number.isInteger(id) || !(await people.revokeInvite(workspace.id, id))) {
      error(404, 'That invitation is no longer pending');
    }
    redirect(303, `/w/${workspace.slug}/members?done=revoked`);
  }
};
