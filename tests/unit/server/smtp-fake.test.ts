/**
 * The local SMTP fake keeps every message in the Outbox folder, and a client that drops its connection
 * mid-session (as an app closing its mail pool does) neither stops it nor takes the process down.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { connect } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import nodemailer from 'nodemailer';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startSmtpFake, type SmtpFake } from '../../../server/mail/smtp-fake';
import { OutboxStore } from '../../../server/mail/outbox-store';

describe('the SMTP fake', () => {
  const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-outbox-'));
  let fake: SmtpFake;
  beforeAll(async () => {
    fake = await startSmtpFake(0, dir);
  });
  afterAll(async () => {
    await fake.close();
    rmSync(dir, { recursive: true, force: true });
  });

  const send = (subject: string) =>
    nodemailer
      .createTransport({ host: '127.0.0.1', port: fake.port, secure: false, ignoreTLS: true })
      .sendMail({ from: 'a@fanlight.test', to: 'b@fanlight.test', subject, text: 'body' });

  it('survives clients that reset their connections, and keeps taking mail', async () => {
    await send('before');
    for (let i = 0; i < 3; i++) {
      // Into a transaction (smtp-server passes a reset inside one on as an 'error' event), then RST.
      await new Promise<void>((resolve) => {
        const commands = ['EHLO x\r\n', 'MAIL FROM:<a@fanlight.test>\r\n'];
        const socket = connect(fake.port, '127.0.0.1');
        socket.on('data', () => {
          const next = commands.shift();
          if (next) socket.write(next);
          else {
            socket.resetAndDestroy(); // the server reads ECONNRESET
            resolve();
          }
        });
      });
    }
    await new Promise((r) => setTimeout(r, 100));
    await send('after');
    const subjects = new OutboxStore(dir).list().map((m) => m.subject);
    expect(subjects).toEqual(expect.arrayContaining(['before', 'after']));
  });
});
