/**
 * Personal API tokens: `lw_` + 32 random bytes (base64url). The token is returned once at
 * creation; only its SHA-256 is stored, so a leaked database does not leak tokens.
 */
import { createHash, randomBytes } from 'node:crypto';
import { Op } from 'sequelize';
import { ApiToken, User } from './db/models';
import type { AuthUser } from './auth';

const sha256 = (s: string) => createHash('sha256').update(s).digest('hex');

export async function createToken(userId: string, name: string, expiresAt: Date | null = null) {
  const token = `lw_${randomBytes(32).toString('base64url')}`;
  const row = await ApiToken.create({
    userId,
    name,
    tokenHash: sha256(token),
    prefix: token.slice(0, 10),
    lastUsedAt: null,
    expiresAt,
    revokedAt: null
  });
  return { token, id: row.id, name: row.name, prefix: row.prefix, expiresAt, createdAt: row.createdAt };
}

export async function listTokens(userId: string) {
  const rows = await ApiToken.findAll({ where: { userId, revokedAt: null }, order: [['createdAt', 'DESC']] });
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    prefix: r.prefix,
    lastUsedAt: r.lastUsedAt,
    expiresAt: r.expiresAt,
    createdAt: r.createdAt
  }));
}

/** Revokes one of the user's own tokens; false when there is no such token. */
export async function revokeToken(userId: string, id: number): Promise<boolean> {
  const [n] = await ApiToken.update({ revokedAt: new Date() }, { where: { id, userId, revokedAt: null } });
  return n > 0;
}

export async function authenticateToken(token: string): Promise<AuthUser | null> {
  if (!token.startsWith('lw_') || token.length > 100) return null;
  const row = await ApiToken.findOne({
    where: {
      tokenHash: sha256(token),
      revokedAt: null,
      [Op.or]: [{ expiresAt: null }, { expiresAt: { [Op.gt]: new Date() } }]
    }
  });
  if (!row) return null;
  const user = await User.findByPk(row.userId);
  if (!user) return null;
  // Record use at most once a minute per token.
  if (!row.lastUsedAt || Date.now() - row.lastUsedAt.getTime() > 60_000) {
    await row.update({ lastUsedAt: new Date() });
  }
  return { id: user.id, email: user.email, displayName: user.displayName, units: user.units };
}
