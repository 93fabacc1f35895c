import { error } from '@sveltejs/kit';
import { reportData } from '$lib/server/report';
import { resolveShareToken } from '$lib/server/share-links';
import type { PageServerLoad } from './$types';

/** The report of the one sweep a share link opens; nothing else is reachable from it. */
export const load: PageServerLoad = async ({ params, setHeaders }) => {
  const sweep = await resolveShareToken(params.token);
  // Same answer for unknown, revoked and expired links: nothing to tell them apart.
  if (!sweep) error(404, 'This share link does not exist, has expired or was revoked');
  setHeaders({ 'cache-control': 'private, no-store', 'x-robots-tag': 'noindex', 'referrer-policy': 'no-referrer' });
  return { report: await reportData(sweep) };
};
