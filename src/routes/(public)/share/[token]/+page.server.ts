import { error } from '@sveltejs/kit';
import { reportData } from '$lib/server/report';
import { resolveShareToken } from '$lib/server/share-links';
import { isUnitSystem } from '$lib/units';
import type { PageServerLoad } from './$types';

/**
 * The report of the one sweep a share link opens; nothing else is reachable from it. Shown in
 * the link's units unless the reader picks the other system with ?units=si|us (any other
 * value falls back to the link's units).
 */
export const load: PageServerLoad = async ({ params, url, setHeaders }) => {
  const shared = await resolveShareToken(params.token);
  // Same answer for unknown, revoked and expired links: nothing to tell them apart.
  if (!shared) error(404, 'This share link does not exist, has expired or was revoked');
  setHeaders({ 'cache-control': 'private, no-store', 'x-robots-tag': 'noindex', 'referrer-policy': 'no-referrer' });
  const asked = url.searchParams.get('units');
  return {
    report: await reportData(shared.sweep),
    units: isUnitSystem(asked) ? asked : shared.units,
    linkUnits: shared.units
  };
};
