/**
 * Small helpers shared by the sweep/study API routes: field-error responses, JSON bodies,
 * ids. Routes stay thin: `return api(async () => json(await service.x(...)))`.
 */
import { error, isHttpError, isRedirect, json } from '@sveltejs/kit';
import type { z } from 'zod';
import { QueueUnavailableError } from './runner';

/** Bad input: 400 with one message per field path. */
export class InputError extends Error {
  constructor(
    message: string,
    readonly errors: Record<string, string>
  ) {
    super(message);
    this.name = 'InputError';
  }
}

/** A state conflict (cancel a completed sweep...): 409. */
export class ConflictError extends Error {}

export function zodErrors(e: z.ZodError, prefix = ''): Record<string, string> {
  const out: Record<string, string> = {};
  for (const i of e.issues) {
    const key = prefix + (i.path.length ? i.path.map(String).join('.') : '');
    const k = key || '_';
    if (!(k in out)) out[k] = i.message;
  }
  return out;
}

export function parseOr400<S extends z.ZodType>(schema: S, input: unknown, prefix = ''): z.output<S> {
  const r = schema.safeParse(input);
  if (!r.success) throw new InputError('Invalid input', zodErrors(r.error, prefix));
  return r.data;
}

export async function readJson(request: Request, maxBytes = 1_000_000): Promise<unknown> {
  const len = Number(request.headers.get('content-length') ?? 0);
  if (len > maxBytes) throw new InputError('Body too large', { _: `at most ${maxBytes} bytes` });
  const text = await request.text();
  if (text.length > maxBytes) throw new InputError('Body too large', { _: `at most ${maxBytes} bytes` });
  if (!text.trim()) return {};
  try {
    return JSON.parse(text);
  } catch {
    throw new InputError('Body must be JSON', { _: 'the request body is not valid JSON' });
  }
}

/** A sweep id from the URL: a positive integer, else 404 (an id that cannot exist). */
export function sweepIdParam(raw: string | undefined): number {
  if (!raw || !/^[1-9][0-9]{0,9}$/.test(raw) || Number(raw) > 4294967295) error(404, 'Sweep not found');
  return Number(raw);
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
export const isUuid = (s: string | null | undefined): s is string => !!s && UUID.test(s);

/** Runs a handler and maps the module's errors onto HTTP responses. */
export async function api(fn: () => Promise<Response>): Promise<Response> {
  try {
    return await fn();
  } catch (e) {
    if (e instanceof InputError) return json({ message: e.message, errors: e.errors }, { status: 400 });
    if (e instanceof ConflictError) return json({ message: e.message }, { status: 409 });
    if (e instanceof QueueUnavailableError) return json({ message: e.message }, { status: 503, headers: { 'retry-after': '5' } });
    if (isHttpError(e)) return json({ message: e.body.message }, { status: e.status });
    if (isRedirect(e)) throw e;
    throw e;
  }
}
