/**
 * Workspace people: invitations (create, revoke, look up, accept), role changes and member
 * removal, with the rule that a workspace always keeps at least one admin.
 * Used by the members page, the accept-invite page and the tests.
 */
import { createHash, randomBytes } from 'node:crypto';
import { Op, type Transaction } from 'sequelize';
import { sequelize } from './db/sequelize';
import { Invite, Membership, User, Workspace, type Role } from './db/models';
import { hashPassword, verifyPassword } from './password';
import { sendMail } from './mail';
import { config } from './config';

export const INVITE_TTL_MS = 7 * 24 * 3600 * 1000;

const sha256 = (s: string) => createHash('sha256').update(s).digest('hex');

/** Expected refusals (shown to the user beside the form); anything else is a bug. */
export class PeopleError extends Error {
  constructor(
    message: string,
    readonly field: string = 'form',
    readonly status = 400
  ) {
    super(message);
    this.name = 'PeopleError';
  }
}

export type InviteState = 'pending' | 'accepted' | 'revoked' | 'expired';

export function inviteState(i: Pick<Invite, 'acceptedAt' | 'revokedAt' | 'expiresAt'>, now = new Date()): InviteState {
  if (i.acceptedAt) return 'accepted';
  if (i.revokedAt) return 'revoked';
  if (i.expiresAt.getTime() <= now.getTime()) return 'expired';
  return 'pending';
}

export function normaliseEmail(email: string): string {
  return email.trim().toLowerCase();
}

/** Header that tags outgoing mail with its workspace, so the outbox page shows only that workspace's mail. */
export const WORKSPACE_MAIL_HEADER = 'X-Loftwise-Workspace';

/**
 * Creates an invitation and e-mails its link. An earlier pending invitation for the same
 * address is revoked, so only the newest link works. Returns the token (for tests); pages
 * never show it.
 */
export async function createInvite(opts: {
  workspaceId: string;
  email: string;
  role: Role;
  invitedBy: { id: string; displayName: string };
}) {
  const email = normaliseEmail(opts.email);
  const ws = await Workspace.findByPk(opts.workspaceId);
  if (!ws) throw new PeopleError('Workspace not found', 'form', 404);
  const existing = await User.findOne({ where: { email } });
  if (existing && (await Membership.findOne({ where: { userId: existing.id, workspaceId: ws.id } }))) {
    throw new PeopleError(`${email} is already a member of this workspace`, 'email');
  }
  const token = randomBytes(32).toString('base64url');
  const invite = await sequelize.transaction(async (transaction) => {
    await Invite.update(
      { revokedAt: new Date() },
      { where: { workspaceId: ws.id, email, acceptedAt: null, revokedAt: null }, transaction }
    );
    return Invite.create(
      {
        workspaceId: ws.id,
        email,
        role: opts.role,
        tokenHash: sha256(token),
        invitedBy: opts.invitedBy.id,
        expiresAt: new Date(Date.now() + INVITE_TTL_MS)
      },
      { transaction }
    );
  });

  const link = `${config.ORIGIN}/invite/${token}`;
  const mail = {
    to: email,
    subject: `${opts.invitedBy.displayName} invited you to ${ws.name} on Loftwise`,
    text: [
      `${opts.invitedBy.displayName} invited you to the workspace "${ws.name}" on Loftwise as ${articleFor(opts.role)} ${opts.role}.`,
      '',
      'Open this link to accept and set your password:',
      link,
      '',
      `The link works once and expires on ${invite.expiresAt.toUTCString()}.`,
      'If you did not expect this e-mail, ignore it.'
    ].join('\n'),
    headers: { [WORKSPACE_MAIL_HEADER]: ws.id }
  };
  try {
    await sendMail(mail);
  } catch (e) {
    // Without the e-mail the invitation is useless: withdraw it and say so.
    await invite.update({ revokedAt: new Date() });
    throw new PeopleError(`The invitation e-mail could not be sent (${(e as Error).message}); try again later`, 'form', 503);
  }
  return { token, invite, link };
}

function articleFor(role: Role) {
  return role === 'admin' || role === 'engineer' ? 'an' : 'a';
}

export async function revokeInvite(workspaceId: string, inviteId: number): Promise<boolean> {
  const [n] = await Invite.update(
    { revokedAt: new Date() },
    { where: { id: inviteId, workspaceId, acceptedAt: null, revokedAt: null } }
  );
  return n > 0;
}

export async function listInvites(workspaceId: string) {
  const rows = await Invite.findAll({
    where: { workspaceId, acceptedAt: null, revokedAt: null, expiresAt: { [Op.gt]: new Date() } },
    order: [['createdAt', 'DESC']]
  });
  return rows.map((r) => ({ id: r.id, email: r.email, role: r.role, expiresAt: r.expiresAt, createdAt: r.createdAt }));
}

/** What the accept page needs to know about a token, without changing anything. */
export async function lookupInvite(token: string) {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return null;
  const invite = await Invite.findOne({ where: { tokenHash: sha256(token) } });
  if (!invite) return null;
  const [ws, user] = await Promise.all([
    Workspace.findByPk(invite.workspaceId),
    User.findOne({ where: { email: invite.email } })
  ]);
  if (!ws) return null;
  return {
    state: inviteState(invite),
    email: invite.email,
    role: invite.role,
    workspace: { id: ws.id, name: ws.name, slug: ws.slug },
    /** The address already has an account with a password: accepting asks for that password. */
    existingUser: Boolean(user?.passwordHash),
    displayName: user?.displayName ?? ''
  };
}

/**
 * Accepts an invitation once. A new address gets an account with the given name and
 * password; an existing account must prove its password (the link alone must not let
 * anyone take over an account). Returns the user id to sign in.
 */
export async function acceptInvite(
  token: string,
  input: { displayName?: string; password: string }
): Promise<{ userId: string; workspaceSlug: string }> {
  const hash = sha256(token);
  return sequelize.transaction(async (transaction: Transaction) => {
    const invite = await Invite.findOne({ where: { tokenHash: hash }, transaction, lock: transaction.LOCK.UPDATE });
    if (!invite) throw new PeopleError('This invitation link is not valid', 'form', 404);
    const state = inviteState(invite);
    if (state !== 'pending') {
      throw new PeopleError(
        state === 'accepted'
          ? 'This invitation has already been used'
          : state === 'revoked'
            ? 'This invitation was withdrawn; ask the workspace admin for a new one'
            : 'This invitation has expired; ask the workspace admin for a new one',
        'form',
        410
      );
    }
    const ws = await Workspace.findByPk(invite.workspaceId, { transaction });
    if (!ws) throw new PeopleError('This invitation link is not valid', 'form', 404);

    let user = await User.findOne({ where: { email: invite.email }, transaction, lock: transaction.LOCK.UPDATE });
    if (user?.passwordHash) {
      if (!(await verifyPassword(user.passwordHash, input.password))) {
        throw new PeopleError('That is not the password of this account', 'password');
      }
    } else {
      const displayName = (input.displayName ?? '').trim();
      if (!displayName) throw new PeopleError('Enter your name', 'displayName');
      const passwordHash = await hashPassword(input.password);
      if (user) await user.update({ displayName, passwordHash }, { transaction });
      else user = await User.create({ email: invite.email, displayName, passwordHash }, { transaction });
    }

    const member = await Membership.findOne({ where: { userId: user.id, workspaceId: ws.id }, transaction });
    if (!member) await Membership.create({ userId: user.id, workspaceId: ws.id, role: invite.role }, { transaction });
    await invite.update({ acceptedAt: new Date(), acceptedBy: user.id }, { transaction });
    return { userId: user.id, workspaceSlug: ws.slug };
  });
}

export async function listMembers(workspaceId: string) {
  const rows = await Membership.findAll({
    where: { workspaceId },
    include: [{ model: User, as: 'user', attributes: ['id', 'email', 'displayName'] }],
    order: [['createdAt', 'ASC']]
  });
  return rows.map((m) => {
    const u = (m as Membership & { user: User }).user;
    return { userId: u.id, email: u.email, displayName: u.displayName, role: m.role, since: m.createdAt };
  });
}

/** Locks the workspace's memberships and refuses a change that would leave no admin. */
async function lockMember(workspaceId: string, userId: string, transaction: Transaction) {
  const all = await Membership.findAll({ where: { workspaceId }, transaction, lock: transaction.LOCK.UPDATE });
  const target = all.find((m) => m.userId === userId);
  if (!target) throw new PeopleError('That person is not a member of this workspace', 'form', 404);
  const admins = all.filter((m) => m.role === 'admin').length;
  return { target, admins };
}

export async function changeRole(workspaceId: string, userId: string, role: Role) {
  await sequelize.transaction(async (transaction) => {
    const { target, admins } = await lockMember(workspaceId, userId, transaction);
    if (target.role === 'admin' && role !== 'admin' && admins <= 1) {
      throw new PeopleError('A workspace needs at least one admin: make someone else admin first', 'role', 409);
    }
    await target.update({ role }, { transaction });
  });
}

export async function removeMember(workspaceId: string, userId: string) {
  await sequelize.transaction(async (transaction) => {
    const { target, admins } = await lockMember(workspaceId, userId, transaction);
    if (target.role === 'admin' && admins <= 1) {
      throw new PeopleError('The last admin cannot be removed: make someone else admin first', 'form', 409);
    }
    await target.destroy({ transaction });
  });
}
