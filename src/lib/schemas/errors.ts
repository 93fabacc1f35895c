import type { z } from 'zod';

/**
 * Zod issues of a flat form → { field: first message } (the first problem of a field is the
 * one to fix first); issues without a path go under `form`. Nested specs use the sweep
 * schema's `fieldErrors`, which keys by the dotted path.
 */
export function errorsOf(issues: readonly z.core.$ZodIssue[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const i of issues) out[String(i.path[0] ?? 'form')] ??= i.message;
  return out;
}
