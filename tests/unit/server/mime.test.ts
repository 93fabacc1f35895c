/**
 * The outbox's MIME reader against messages built by nodemailer's own MailComposer (the
 * library that sends Loftwise's mail), plus the RFC 2047 §8 examples of encoded words.
 */
import { describe, expect, it } from 'vitest';
import MailComposer from 'nodemailer/lib/mail-composer/index.js';
import type Mail from 'nodemailer/lib/mailer';
import { decodeEncodedWords, decodeQuotedPrintable, readMessage } from '../../../src/lib/server/mime';

function compose(mail: Mail.Options): Promise<string> {
  return new Promise((resolve, reject) =>
    new MailComposer(mail).compile().build((err, msg) => (err ? reject(err) : resolve(msg.toString('utf8'))))
  );
}

describe('readMessage', () => {
  const link = `http://127.0.0.1:3000/invite/${'Ab0_-'.repeat(9)}`;
  const text = `Dana Quill invited you to "Tarnwick Orbital · Small Launcher" as an engineer — a line long enough that quoted-printable has to wrap it somewhere.\n\n${link}\n`;

  it('decodes a quoted-printable text message with a non-ASCII subject', async () => {
    const raw = await compose({ from: 'a@x.example', to: 'b@x.example', subject: 'Invitation · Small Launcher', text, headers: { 'X-Loftwise-Workspace': 'w1' } });
    expect(raw).toMatch(/Content-Transfer-Encoding: quoted-printable/i);
    const m = readMessage(raw);
    expect(m.headers.subject).toBe('Invitation · Small Launcher');
    expect(m.headers['x-loftwise-workspace']).toBe('w1');
    expect(m.text).toBe(text.trimEnd());
  });

  it('picks the text part of a multipart/alternative message', async () => {
    const raw = await compose({ from: 'a@x.example', to: 'b@x.example', subject: 'Hi', text, html: `<p>${text}</p>` });
    expect(raw).toMatch(/multipart\/alternative/i);
    expect(readMessage(raw).text).toBe(text.trimEnd());
  });

  it('decodes base64 bodies', async () => {
    const raw = await compose({ from: 'a@x.example', to: 'b@x.example', subject: 'Hi', text: 'Grüße', textEncoding: 'base64' });
    expect(readMessage(raw).text).toBe('Grüße');
  });
});

describe('encoded words (RFC 2047 §8 examples)', () => {
  it('decodes Q and B words and joins adjacent words', () => {
    expect(decodeEncodedWords('=?ISO-8859-1?Q?a?=')).toBe('a'); // other charsets are left as their text
    expect(decodeEncodedWords('(=?UTF-8?Q?a?= =?UTF-8?Q?b?=)')).toBe('(ab)');
    expect(decodeEncodedWords('=?UTF-8?Q?a_b?=')).toBe('a b');
    expect(decodeEncodedWords('=?utf-8?B?Q2Fmw6k=?=')).toBe('Café');
    expect(decodeQuotedPrintable('Caf=C3=A9 =\r\nau lait')).toBe('Café au lait');
  });
});
