/** The token API over tokens.ts: create (shown once), list, revoke. */
import { error } from '@sveltejs/kit';
import { z } from 'zod';
import { createToken, listTokens, revokeToken } from '../tokens';
import { parseOr400 } from './http';

export const tokenCreateSchema = z
  .object({
    name: z.string({ error: 'name is required' }).trim().min(1, 'the token needs a name').max(80, 'name must be at most 80 characters'),
    expiresInDays: z.number({ error: 'expiresInDays must be a number' }).int('expiresInDays must be a whole number').min(1).max(3650).nullable().default(null)
  })
  .strict();

export async function createApiToken(locals: App.Locals, body: unknown) {
  // A leaked token must not mint more tokens: creating one needs a signed-in browser session.
  if (locals.via !== 'cookie') error(403, 'Create tokens from a signed-in session, not with a token');
  const input = parseOr400(tokenCreateSchema, body);
  const expires = input.expiresInDays ? new Date(Date.now() + input.expiresInDays * 86_400_000) : null;
  return createToken(locals.user!.id, input.name, expires);
}

export const listApiTokens = (locals: App.Locals) => listTokens(locals.user!.id);

export async function revokeApiToken(locals: App.Locals, rawId: string) {
  const id = /^[1-9][0-9]{0,9}$/.test(rawId) ? Number(rawId) : NaN;
  if (!Number.isFinite(id) || !(await revokeToken(locals.user!.id, id))) error(404, 'Token not found');
  return { revoked: id };
}
