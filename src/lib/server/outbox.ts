/**
 * The outbox page's data: mail the fake SMTP server caught for one workspace. Mail sent on a
 * workspace's behalf carries its id in a header (people.WORKSPACE_MAIL_HEADER), so one
 * workspace's admins never read another's invitations.
 */
import { Op } from 'sequelize';
import { MailMessage } from './db/models';
import { WORKSPACE_MAIL_HEADER } from './people';
import { decodeEncodedWords, readMessage } from './mime';

export const OUTBOX_LIMIT = 200;

function ofWorkspace(workspaceId: string) {
  return { raw: { [Op.like]: `%${WORKSPACE_MAIL_HEADER}: ${workspaceId}%` } };
}

export async function list(workspaceId: string) {
  const rows = await MailMessage.findAll({
    where: ofWorkspace(workspaceId),
    attributes: ['id', 'rcptTo', 'subject', 'createdAt'],
    order: [['id', 'DESC']],
    limit: OUTBOX_LIMIT
  });
  return rows.map((m) => ({ id: m.id, to: m.rcptTo, subject: decodeEncodedWords(m.subject), createdAt: m.createdAt }));
}

/** One message of the workspace, decoded; null when missing or another workspace's. */
export async function read(workspaceId: string, id: number) {
  if (!Number.isInteger(id) || id <= 0) return null;
  const m = await MailMessage.findOne({ where: { id, ...ofWorkspace(workspaceId) } });
  if (!m) return null;
  const { headers, text } = readMessage(m.raw);
  return { id: m.id, from: headers.from ?? m.mailFrom, to: headers.to ?? m.rcptTo, subject: headers.subject ?? '', date: m.createdAt, text };
}
