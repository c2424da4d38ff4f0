/**
 * A local SMTP server on 127.0.0.1 that accepts every message and keeps it in the Outbox folder, so
 * invitations and reset links can be followed without a real mail host (development and tests only).
 */
import { randomUUID } from 'node:crypto';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { OutboxStore } from './outbox-store';

const addresses = (a: AddressObject | AddressObject[] | undefined): string[] =>
  (Array.isArray(a) ? a : a ? [a] : []).flatMap((x) => x.value.map((v) => v.address ?? '')).filter(Boolean);

export interface SmtpFake {
  port: number;
  close(): Promise<void>;
}

export async function startSmtpFake(port: number, outboxDir: string): Promise<SmtpFake> {
  const store = new OutboxStore(outboxDir);
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    banner: 'Fanlight local mail fake',
    logger: false,
    size: 5 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          store.save({
            id: randomUUID(),
            receivedAt: new Date().toISOString(),
            from: addresses(mail.from)[0] ?? session.envelope.mailFrom?.toString() ?? '',
            to: addresses(mail.to).length ? addresses(mail.to) : session.envelope.rcptTo.map((r) => r.address),
            subject: mail.subject ?? '',
            text: mail.text ?? '',
          });
          callback();
        })
        .catch((e: Error) => callback(e));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => {
      server.off('error', reject);
      resolve();
    });
  });
  // smtp-server reports a client's dropped connection (ECONNRESET when an app closes its mail pool) as
  // an 'error' event; with no listener that would throw and take the whole process down.
  server.on('error', (e: NodeJS.ErrnoException) => {
    if (e.code !== 'ECONNRESET' && e.code !== 'EPIPE') console.error('fanlight mail fake:', e.message);
  });
  const address = server.server.address();
  return {
    port: typeof address === 'object' && address ? address.port : port,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
