/**
 * Invitations, roles and member removal on the real test database, with the fake SMTP
 * server running in this process on its own port: the invitation e-mail must arrive there
 * with a working link. Each test works in a workspace of its own, so the seeded demo data
 * other suites rely on is untouched.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash, randomUUID } from 'node:crypto';
import type { SMTPServer } from 'smtp-server';

process.env.SMTP_PORT = '2546';
process.env.ORIGIN = 'http://127.0.0.1:3999';
const { startMailbox } = await import('../../src/lib/server/mailbox');
const { sequelize } = await import('../../src/lib/server/db/sequelize');
const { Invite, MailMessage, Membership, User, Workspace } = await import('../../src/lib/server/db/models');
const people = await import('../../src/lib/server/people');
const { hashPassword, verifyPassword } = await import('../../src/lib/server/password');
const { readMessage } = await import('../../src/lib/server/mime');
const outbox = await import('../../src/lib/server/outbox');

const tag = randomUUID().slice(0, 8);
const email = (who: string) => `${who}-${tag}@people-test.example`;

let mailbox: SMTPServer;
const workspaces: string[] = [];
const users: string[] = [];

async function workspace(name = 'People test') {
  const ws = await Workspace.create({ name: `${name} ${tag}`, slug: `people-${tag}-${workspaces.length}`, description: '' });
  workspaces.push(ws.id);
  return ws;
}
async function user(who: string, password = 'old-password-1') {
  const u = await User.create({ email: email(who), displayName: who, passwordHash: await hashPassword(password) });
  users.push(u.id);
  return u;
}
async function mailTo(address: string) {
  for (let i = 0; i < 50; i++) {
    const m = await MailMessage.findOne({ where: { rcptTo: address }, order: [['id', 'DESC']] });
    if (m) return m;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no mail to ${address}`);
}

beforeAll(async () => {
  mailbox = await startMailbox(2546);
});
afterAll(async () => {
  await Workspace.destroy({ where: { id: workspaces } });
  const invitedUsers = await User.findAll({ where: { email: { [(await import('sequelize')).Op.like]: `%-${tag}@people-test.example` } } });
  await User.destroy({ where: { id: [...users, ...invitedUsers.map((u) => u.id)] } });
  await new Promise<void>((r) => mailbox.close(() => r()));
  await sequelize.close();
});

describe('invitation lifecycle', () => {
  it('e-mails a one-time link through the SMTP server and stores only the token hash', async () => {
    const ws = await workspace();
    const admin = await user('admin-a');
    await Membership.create({ userId: admin.id, workspaceId: ws.id, role: 'admin' });

    const { token } = await people.createInvite({ workspaceId: ws.id, email: `  ${email('NewPerson').toUpperCase()} `, role: 'engineer', invitedBy: admin });
    const row = await Invite.findOne({ where: { workspaceId: ws.id } });
    expect(row!.email).toBe(email('newperson'));
    expect(row!.tokenHash).toBe(createHash('sha256').update(token).digest('hex'));
    expect(row!.tokenHash).not.toContain(token);
    expect(row!.invitedBy).toBe(admin.id);
    expect(row!.expiresAt.getTime() - Date.now()).toBeGreaterThan(people.INVITE_TTL_MS - 60_000);

    const mail = await mailTo(email('newperson'));
    const { headers, text } = readMessage(mail.raw);
    expect(headers.subject).toBe(`admin-a invited you to People test ${tag} on Loftwise`);
    expect(text).toContain(`http://127.0.0.1:3999/invite/${token}`);

    // The outbox of this workspace lists it; another workspace's outbox does not.
    const other = await workspace('Other');
    expect((await outbox.list(ws.id)).map((m) => m.id)).toContain(mail.id);
    expect((await outbox.list(other.id)).map((m) => m.id)).not.toContain(mail.id);
    expect(await outbox.read(other.id, mail.id)).toBeNull();
    expect((await outbox.read(ws.id, mail.id))!.text).toContain('/invite/');
  });

  it('creates the account and membership on accept, and works only once', async () => {
    const ws = await workspace();
    const admin = await user('admin-b');
    const { token } = await people.createInvite({ workspaceId: ws.id, email: email('ada'), role: 'viewer', invitedBy: admin });
    expect((await people.lookupInvite(token))!.state).toBe('pending');
    expect((await people.lookupInvite(token))!.existingUser).toBe(false);

    const res = await people.acceptInvite(token, { displayName: ' Ada Lin ', password: 'a-long-passphrase' });
    const ada = await User.findByPk(res.userId);
    expect(ada!.email).toBe(email('ada'));
    expect(ada!.displayName).toBe('Ada Lin');
    expect(await verifyPassword(ada!.passwordHash!, 'a-long-passphrase')).toBe(true);
    expect((await Membership.findOne({ where: { userId: ada!.id, workspaceId: ws.id } }))!.role).toBe('viewer');
    expect(res.workspaceSlug).toBe(ws.slug);

    await expect(people.acceptInvite(token, { displayName: 'Again', password: 'another-passphrase' })).rejects.toMatchObject({
      status: 410,
      message: 'This invitation has already been used'
    });
    expect((await people.lookupInvite(token))!.state).toBe('accepted');
    // The second attempt changed nothing.
    expect(await verifyPassword((await User.findByPk(ada!.id))!.passwordHash!, 'a-long-passphrase')).toBe(true);
  });

  it('refuses expired, withdrawn, superseded and unknown tokens', async () => {
    const ws = await workspace();
    const admin = await user('admin-c');
    const a = await people.createInvite({ workspaceId: ws.id, email: email('late'), role: 'viewer', invitedBy: admin });
    await a.invite.update({ expiresAt: new Date(Date.now() - 1000) });
    await expect(people.acceptInvite(a.token, { displayName: 'Late', password: 'a-long-passphrase' })).rejects.toMatchObject({ status: 410 });
    expect((await people.lookupInvite(a.token))!.state).toBe('expired');

    const b = await people.createInvite({ workspaceId: ws.id, email: email('first'), role: 'viewer', invitedBy: admin });
    const c = await people.createInvite({ workspaceId: ws.id, email: email('first'), role: 'engineer', invitedBy: admin });
    expect((await people.lookupInvite(b.token))!.state).toBe('revoked');
    expect((await people.listInvites(ws.id)).map((i) => i.email)).toEqual([email('first')]);

    expect(await people.revokeInvite(ws.id, c.invite.id)).toBe(true);
    expect(await people.revokeInvite(ws.id, c.invite.id)).toBe(false);
    await expect(people.acceptInvite(c.token, { displayName: 'F', password: 'a-long-passphrase' })).rejects.toMatchObject({ status: 410 });
    expect(await User.findOne({ where: { email: email('first') } })).toBeNull();

    expect(await people.lookupInvite('not-a-token')).toBeNull();
    await expect(people.acceptInvite('x'.repeat(43), { password: 'whatever-long' })).rejects.toMatchObject({ status: 404 });
  });

  it('asks an existing account for its own password and leaves that password unchanged', async () => {
    const ws = await workspace();
    const admin = await user('admin-d');
    const bo = await user('bo', 'bo-own-password');
    const { token } = await people.createInvite({ workspaceId: ws.id, email: bo.email, role: 'engineer', invitedBy: admin });
    expect((await people.lookupInvite(token))!.existingUser).toBe(true);

    await expect(people.acceptInvite(token, { password: 'guessed-password' })).rejects.toMatchObject({ field: 'password' });
    expect(await Membership.findOne({ where: { userId: bo.id, workspaceId: ws.id } })).toBeNull();
    expect((await people.lookupInvite(token))!.state).toBe('pending');

    const res = await people.acceptInvite(token, { displayName: 'Ignored', password: 'bo-own-password' });
    expect(res.userId).toBe(bo.id);
    const after = await User.findByPk(bo.id);
    expect(after!.displayName).toBe('bo');
    expect(await verifyPassword(after!.passwordHash!, 'bo-own-password')).toBe(true);
    expect((await Membership.findOne({ where: { userId: bo.id, workspaceId: ws.id } }))!.role).toBe('engineer');
  });

  it('refuses to invite someone who is already a member', async () => {
    const ws = await workspace();
    const admin = await user('admin-e');
    await Membership.create({ userId: admin.id, workspaceId: ws.id, role: 'admin' });
    await expect(people.createInvite({ workspaceId: ws.id, email: admin.email, role: 'viewer', invitedBy: admin })).rejects.toMatchObject({
      field: 'email'
    });
    expect(await Invite.count({ where: { workspaceId: ws.id } })).toBe(0);
  });
});

describe('roles and the last admin', () => {
  it('never leaves a workspace without an admin', async () => {
    const ws = await workspace();
    const [a, b] = [await user('admin-f'), await user('eng-f')];
    await Membership.create({ userId: a.id, workspaceId: ws.id, role: 'admin' });
    await Membership.create({ userId: b.id, workspaceId: ws.id, role: 'engineer' });
    const roleOf = async (u: { id: string }) => (await Membership.findOne({ where: { userId: u.id, workspaceId: ws.id } }))?.role;

    await expect(people.changeRole(ws.id, a.id, 'engineer')).rejects.toMatchObject({ status: 409, field: 'role' });
    await expect(people.removeMember(ws.id, a.id)).rejects.toMatchObject({ status: 409 });
    expect(await roleOf(a)).toBe('admin');

    await people.changeRole(ws.id, b.id, 'admin');
    await people.changeRole(ws.id, a.id, 'viewer');
    expect(await roleOf(a)).toBe('viewer');
    await expect(people.removeMember(ws.id, b.id)).rejects.toMatchObject({ status: 409 });
    await people.removeMember(ws.id, a.id);
    expect(await roleOf(a)).toBeUndefined();
    expect((await people.listMembers(ws.id)).map((m) => [m.email, m.role])).toEqual([[b.email, 'admin']]);
  });

  it('keeps one admin when two demotions race', async () => {
    const ws = await workspace();
    const [a, b] = [await user('admin-g'), await user('admin-h')];
    await Membership.create({ userId: a.id, workspaceId: ws.id, role: 'admin' });
    await Membership.create({ userId: b.id, workspaceId: ws.id, role: 'admin' });
    const results = await Promise.allSettled([people.changeRole(ws.id, a.id, 'viewer'), people.changeRole(ws.id, b.id, 'viewer')]);
    expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(1);
    expect(await Membership.count({ where: { workspaceId: ws.id, role: 'admin' } })).toBe(1);
  });

  it('refuses changes to someone who is not a member', async () => {
    const ws = await workspace();
    const stranger = await user('stranger');
    await expect(people.changeRole(ws.id, stranger.id, 'admin')).rejects.toMatchObject({ status: 404 });
    await expect(people.removeMember(ws.id, stranger.id)).rejects.toMatchObject({ status: 404 });
  });
});
