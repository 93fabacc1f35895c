/**
 * Share links: anonymous, read-only access to ONE sweep's report. The token is 32 random
 * bytes (base64url, 43 characters: unguessable), shown once when created; only its SHA-256
 * is stored (share_links.token_hash), with a short prefix so people can tell links apart.
 * Every link expires; revoking sets revoked_at. Each link carries the display units of its
 * report (share_links.units, 'si' | 'us'). Owned by the web pages (sweep page + /share).
 */
import { createHash, randomBytes } from 'node:crypto';
import { Op } from 'sequelize';
import type { UnitSystem } from '../units';
import { ShareLink, Sweep } from './db/models';

export { SHARE_EXPIRY_DAYS } from '../schemas/share';

const TOKEN = /^[A-Za-z0-9_-]{43}$/;

export const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

export interface ShareLinkView {
  id: number;
  label: string;
  prefix: string;
  units: UnitSystem;
  createdAt: string;
  expiresAt: string | null;
  revokedAt: string | null;
  lastOpenedAt: string | null;
  active: boolean;
}

function view(l: ShareLink): ShareLinkView {
  const iso = (d: Date | null | undefined) => (d ? new Date(d).toISOString() : null);
  const active = !l.revokedAt && (!l.expiresAt || new Date(l.expiresAt).getTime() > Date.now());
  return {
    id: l.id,
    label: l.label,
    prefix: l.prefix,
    units: l.units,
    createdAt: iso(l.createdAt)!,
    expiresAt: iso(l.expiresAt),
    revokedAt: iso(l.revokedAt),
    lastOpenedAt: iso(l.lastOpenedAt),
    active
  };
}

export async function listShareLinks(sweepId: number): Promise<ShareLinkView[]> {
  const rows = await ShareLink.findAll({ where: { sweepId }, order: [['createdAt', 'DESC']], limit: 100 });
  return rows.map(view);
}

export async function createShareLink(sweepId: number, userId: string, label: string, days: number, units: UnitSystem) {
  const token = randomBytes(32).toString('base64url');
  const link = await ShareLink.create({
    sweepId,
    tokenHash: hashToken(token),
    prefix: token.slice(0, 6),
    label,
    units,
    createdBy: userId,
    expiresAt: new Date(Date.now() + days * 86_400_000)
  });
  return { token, link: view(link) };
}

/** Revokes a link of this sweep; false when the id is not one of its links. */
export async function revokeShareLink(sweepId: number, id: number): Promise<boolean> {
  const [n] = await ShareLink.update({ revokedAt: new Date() }, { where: { id, sweepId, revokedAt: { [Op.is]: null } } });
  if (n === 1) return true;
  return (await ShareLink.count({ where: { id, sweepId } })) === 1;
}

/**
 * The sweep a token opens and the units its report was shared in, or null when the token is
 * malformed, unknown, revoked or expired.
 */
export async function resolveShareToken(token: string): Promise<{ sweep: Sweep; units: UnitSystem } | null> {
  if (!TOKEN.test(token)) return null;
  const link = await ShareLink.findOne({ where: { tokenHash: hashToken(token) } });
  if (!link || link.revokedAt || (link.expiresAt && new Date(link.expiresAt).getTime() <= Date.now())) return null;
  await ShareLink.update({ lastOpenedAt: new Date() }, { where: { id: link.id } });
  const sweep = await Sweep.findByPk(link.sweepId);
  return sweep ? { sweep, units: link.units } : null;
}
