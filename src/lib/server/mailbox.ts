/**
 * The local fake SMTP server (smtp-server): accepts every message on loopback and keeps it
 * in the `mail_messages` table, where admins read it on the outbox page. Development and
 * tests only; never exposed beyond 127.0.0.1.
 */
import { SMTPServer } from 'smtp-server';
import { MailMessage } from './db/models';

const MAX_BYTES = 5 * 1024 * 1024;

function header(raw: string, name: string): string {
  const head = raw.split(/\r?\n\r?\n/, 1)[0] ?? '';
  const m = head.match(new RegExp(`^${name}:[ \\t]*((?:.*)(?:\\r?\\n[ \\t].*)*)`, 'im'));
  return m ? m[1].replace(/\r?\n[ \t]+/g, ' ').trim() : '';
}

export function createMailbox() {
  return new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    size: MAX_BYTES,
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', async () => {
        try {
          const raw = Buffer.concat(chunks).toString('utf8');
          await MailMessage.create({
            mailFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            rcptTo: session.envelope.rcptTo.map((r) => r.address).join(', ').slice(0, 2000),
            subject: header(raw, 'Subject').slice(0, 500),
            raw
          });
          callback();
        } catch (e) {
          callback(e as Error);
        }
      });
    }
  });
}

export function startMailbox(port: number, host = '127.0.0.1'): Promise<SMTPServer> {
  const server = createMailbox();
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve(server));
  });
}
