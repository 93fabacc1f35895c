/**
 * Sessions: lucia 3 behind this one module (lucia is in maintenance mode; routes never
 * import it, so it can be replaced here alone). Sessions live in MariaDB through an
 * adapter written against lucia's `Adapter` interface over the Sequelize models.
 */
import { Lucia, type Adapter, type DatabaseSession, type DatabaseUser } from 'lucia';
import { Op } from 'sequelize';
import { Session, User } from './db/models';
import { config } from './config';
import { dummyHash, verifyPassword } from './password';

const adapter: Adapter = {
  async getSessionAndUser(sessionId) {
    const row = await Session.findByPk(sessionId, { include: [{ model: User, as: 'user' }] });
    if (!row) return [null, null];
    const user = (row as Session & { user?: User }).user;
    return [toDbSession(row), user ? toDbUser(user) : null];
  },
  async getUserSessions(userId) {
    const rows = await Session.findAll({ where: { userId } });
    return rows.map(toDbSession);
  },
  async setSession(s) {
    await Session.create({ id: s.id, userId: s.userId, expiresAt: s.expiresAt });
  },
  async updateSessionExpiration(sessionId, expiresAt) {
    await Session.update({ expiresAt }, { where: { id: sessionId } });
  },
  async deleteSession(sessionId) {
    await Session.destroy({ where: { id: sessionId } });
  },
  async deleteUserSessions(userId) {
    await Session.destroy({ where: { userId } });
  },
  async deleteExpiredSessions() {
    await Session.destroy({ where: { expiresAt: { [Op.lte]: new Date() } } });
  }
};


function toDbSession(row: Session): DatabaseSession {
  return { id: row.id, userId: row.userId, expiresAt: new Date(row.expiresAt), attributes: {} };
}
function toDbUser(u: User): DatabaseUser {
  return { id: u.id, attributes: { email: u.email, displayName: u.displayName, units: u.units } };
}

export const lucia = new Lucia(adapter, {
  sessionCookie: {
    name: 'lw_session',
    attributes: { secure: config.ORIGIN.startsWith('https:'), sameSite: 'lax' }
  },
  getUserAttributes: (a) => ({ email: a.email, displayName: a.displayName, units: a.units })
});

declare module 'lucia' {
  interface Register {
    Lucia: typeof lucia;
    DatabaseUserAttributes: { email: string; displayName: string; units: 'si' | 'us' };
  }
}

export type AuthUser = import('lucia').User;
export type AuthSession = import('lucia').Session;

export const SESSION_COOKIE = lucia.sessionCookieName;

/**
 * Checks an e-mail and password. Unknown user and wrong password take the same time and
 * give the same answer (null), so the response never tells which one it was.
 */
export async function checkCredentials(email: string, password: string): Promise<User | null> {
  const user = await User.findOne({ where: { email: email.trim().toLowerCase() } });
  const ok = await verifyPassword(user?.passwordHash ?? (await dummyHash()), password);
  return user && user.passwordHash && ok ? user : null;
}

export async function createSession(userId: string) {
  const session = await lucia.createSession(userId, {});
  return { session, cookie: lucia.createSessionCookie(session.id) };
}

export async function validateSession(sessionId: string) {
  const result = await lucia.validateSession(sessionId);
  return {
    ...result,
    cookie: result.session?.fresh
      ? lucia.createSessionCookie(result.session.id)
      : !result.session
        ? lucia.createBlankSessionCookie()
        : null
  };
}

export async function invalidateSession(sessionId: string) {
  await lucia.invalidateSession(sessionId);
  return lucia.createBlankSessionCookie();
}

/** Ends every session of a user except `keepSessionId` (password change). */
export async function invalidateOtherSessions(userId: string, keepSessionId: string) {
  await Session.destroy({ where: { userId, id: { [Op.ne]: keepSessionId } } });
}
