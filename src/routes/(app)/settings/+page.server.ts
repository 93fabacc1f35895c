import { error, fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { checkCredentials, invalidateOtherSessions } from '$lib/server/auth';
import { hashPassword } from '$lib/server/password';
import { createToken, listTokens, revokeToken } from '$lib/server/tokens';
import { User } from '$lib/server/db/models';
import { NewPassword, errorsOf } from '$lib/schemas/account';
import { UNIT_SYSTEMS } from '$lib/units';
import type { Actions, PageServerLoad } from './$types';

const UnitsForm = z.object({ units: z.enum(UNIT_SYSTEMS as ['si', 'us'], { error: 'Choose a unit system' }) });
const PasswordForm = z
  .object({
    current: z.string().min(1, 'Enter your current password').max(1024),
    password: NewPassword,
    confirm: z.string()
  })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ' });
const TokenForm = z.object({
  name: z.string().trim().min(1, 'Give the token a name, for example "sweep script"').max(80, 'Use at most 80 characters'),
  expires: z.enum(['30', '90', '365', 'never'], { error: 'Choose when the token expires' })
});

export const load: PageServerLoad = async ({ locals, url }) => {
  const user = locals.user!;
  return { tokens: await listTokens(user.id), notice: url.searchParams.get('done') };
};

export const actions: Actions = {
  units: async ({ locals, request }) => {
    const parsed = UnitsForm.safeParse(Object.fromEntries(await request.formData()));
    if (!parsed.success) return fail(400, { action: 'units' as const, errors: errorsOf(parsed.error.issues) });
    await User.update({ units: parsed.data.units }, { where: { id: locals.user!.id } });
    redirect(303, '/settings?done=units');
  },

  password: async ({ locals, request }) => {
    const user = locals.user!;
    if (!locals.session) error(403, 'Change your password from a signed-in browser session');
    const parsed = PasswordForm.safeParse(Object.fromEntries(await request.formData()));
    // Nothing typed into a password field is sent back.
    if (!parsed.success) return fail(400, { action: 'password' as const, errors: errorsOf(parsed.error.issues) });
    const ok = await checkCredentials(user.email, parsed.data.current);
    if (!ok) return fail(400, { action: 'password' as const, errors: { current: 'That is not your current password' } });
    if (parsed.data.current === parsed.data.password) {
      return fail(400, { action: 'password' as const, errors: { password: 'Choose a password different from the current one' } });
    }
    await User.update({ passwordHash: await hashPassword(parsed.data.password) }, { where: { id: user.id } });
    await invalidateOtherSessions(user.id, locals.session.id);
    redirect(303, '/settings?done=password');
  },

  createToken: async ({ locals, request }) => {
    const form = Object.fromEntries(await request.formData());
    const values = { name: typeof form.name === 'string' ? form.name : '', expires: typeof form.expires === 'string' ? form.expires : '90' };
    const parsed = TokenForm.safeParse(form);
    if (!parsed.success) return fail(400, { action: 'createToken' as const, values, errors: errorsOf(parsed.error.issues) });
    const days = parsed.data.expires === 'never' ? null : Number(parsed.data.expires);
    const expiresAt = days ? new Date(Date.now() + days * 86_400_000) : null;
    const created = await createToken(locals.user!.id, parsed.data.name, expiresAt);
    // Not a redirect: the token is shown this once, in this response, and never stored in clear.
    return { action: 'createToken' as const, created: { name: created.name, token: created.token } };
  },

  revokeToken: async ({ locals, request }) => {
    const id = Number((await request.formData()).get('id'));
    if (!Number.isInteger(id) || !(await revokeToken(locals.user!.id, id))) error(404, 'No such token');
    redirect(303, '/settings?done=revoked');
  }
};
