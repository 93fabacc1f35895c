import { json, redirect, type Handle, type HandleServerError } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { SESSION_COOKIE, validateSession } from '$lib/server/auth';
import { authenticateToken } from '$lib/server/tokens';

/** Paths anyone may open without signing in. */
const PUBLIC = [/^\/signin(\/|$)/, /^\/invite\//, /^\/share\//, /^\/api\/health$/, /^\/_app\//, /^\/favicon/];

const authenticate: Handle = async ({ event, resolve }) => {
  event.locals.requestId = crypto.randomUUID();
  event.locals.user = null;
  event.locals.session = null;
  event.locals.via = null;

  const bearer = event.request.headers.get('authorization')?.match(/^Bearer\s+(\S+)$/i)?.[1];
  if (bearer) {
    const user = await authenticateToken(bearer);
    if (!user) return json({ message: 'Invalid or revoked API token' }, { status: 401 });
    event.locals.user = user;
    event.locals.via = 'token';
  } else {
    const sessionId = event.cookies.get(SESSION_COOKIE);
    if (sessionId) {
      const { user, session, cookie } = await validateSession(sessionId);
      if (cookie) event.cookies.set(cookie.name, cookie.value, { path: '.', ...cookie.attributes });
      event.locals.user = user;
      event.locals.session = session;
      event.locals.via = session ? 'cookie' : null;
    }
  }
  return resolve(event);
};

const gate: Handle = async ({ event, resolve }) => {
  const path = event.url.pathname;
  if (!event.locals.user && !PUBLIC.some((re) => re.test(path))) {
    if (path.startsWith('/api/')) return json({ message: 'Sign in required' }, { status: 401 });
    const next = path === '/' ? '' : `?next=${encodeURIComponent(path + event.url.search)}`;
    redirect(303, `/signin${next}`);
  }
  const response = await resolve(event);
  response.headers.set('x-request-id', event.locals.requestId);
  return response;
};

export const handle = sequence(authenticate, gate);

export const handleError: HandleServerError = ({ error, event, status, message }) => {
  const id = event.locals.requestId ?? crypto.randomUUID();
  if (status >= 500) console.error(`[${id}] ${event.request.method} ${event.url.pathname}`, error);
  return { message: status >= 500 ? 'Something went wrong on our side' : message, id };
};
