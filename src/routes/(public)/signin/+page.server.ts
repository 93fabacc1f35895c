import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { errorsOf } from '$lib/schemas/errors';
import { checkCredentials, createSession } from '$lib/server/auth';
import type { Actions, PageServerLoad } from './$types';

const SignIn = z.object({
  email: z.string().trim().min(1, 'Enter your e-mail address').max(254).email('Enter a valid e-mail address'),
  password: z.string().min(1, 'Enter your password').max(1024)
});

/** Only same-site paths are followed after sign-in. */
function safeNext(next: string | null): string {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : '/';
}

export const load: PageServerLoad = async ({ locals, url }) => {
  if (locals.user) redirect(303, safeNext(url.searchParams.get('next')));
  return {};
};

export const actions: Actions = {
  default: async ({ request, cookies, url }) => {
    const form = Object.fromEntries(await request.formData());
    const parsed = SignIn.safeParse(form);
    const email = typeof form.email === 'string' ? form.email : '';
    if (!parsed.success) {
      return fail(400, { email, errors: errorsOf(parsed.error.issues) });
    }
    const user = await checkCredentials(parsed.data.email, parsed.data.password);
    if (!user) {
      // One message for an unknown user and a wrong password.
      return fail(400, { email, errors: { form: 'That e-mail and password do not match an account.' } });
    }
    const { cookie } = await createSession(user.id);
    cookies.set(cookie.name, cookie.value, { path: '.', ...cookie.attributes });
    redirect(303, safeNext(url.searchParams.get('next')));
  }
};
