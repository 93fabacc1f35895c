import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { createSession, invalidateSession } from '$lib/server/auth';
import * as people from '$lib/server/people';
import { DisplayName, NewPassword, errorsOf } from '$lib/schemas/account';
import type { Actions, PageServerLoad } from './$types';

const NewAccount = z
  .object({ displayName: DisplayName, password: NewPassword, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ' });
const ExistingAccount = z.object({ password: z.string().min(1, 'Enter the password of your account').max(1024) });

export const load: PageServerLoad = async ({ params }) => {
  const invite = await people.lookupInvite(params.token);
  if (!invite) return { invite: null };
  return {
    invite: {
      state: invite.state,
      email: invite.email,
      role: invite.role,
      workspaceName: invite.workspace.name,
      existingUser: invite.existingUser,
      displayName: invite.displayName
    }
  };
};

export const actions: Actions = {
  default: async ({ params, request, cookies, locals }) => {
    const invite = await people.lookupInvite(params.token);
    if (!invite) return fail(404, { values: { displayName: '' }, errors: { form: 'This invitation link is not valid' } });
    const form = Object.fromEntries(await request.formData());
    // Passwords are never echoed back.
    const values = { displayName: typeof form.displayName === 'string' ? form.displayName : '' };
    const parsed = invite.existingUser ? ExistingAccount.safeParse(form) : NewAccount.safeParse(form);
    if (!parsed.success) return fail(400, { values, errors: errorsOf(parsed.error.issues) });

    let accepted: { userId: string; workspaceSlug: string };
    try {
      accepted = await people.acceptInvite(params.token, {
        displayName: invite.existingUser ? undefined : values.displayName,
        password: parsed.data.password
      });
    } catch (e) {
      if (e instanceof people.PeopleError) return fail(e.status === 410 ? 410 : 400, { values, errors: { [e.field]: e.message } });
      throw e;
    }
    if (locals.session) await invalidateSession(locals.session.id);
    const { cookie } = await createSession(accepted.userId);
    cookies.set(cookie.name, cookie.value, { path: '/', ...cookie.attributes });
    redirect(303, `/w/${accepted.workspaceSlug}`);
  }
};
