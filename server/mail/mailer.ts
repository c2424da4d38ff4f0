import nodemailer from 'nodemailer';
import type { SmtpConfig } from '../config';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

/** nodemailer over SMTP: to the local fake by default, or the host set by SMTP_HOST. */
export function createMailer(smtp: SmtpConfig): Mailer {
  const transport = nodemailer.createTransport({
    host: smtp.host,
    port: smtp.port,
    secure: smtp.secure,
    ignoreTLS: smtp.useFake, // the fake speaks plain SMTP on loopback
    auth: smtp.user ? { user: smtp.user, pass: smtp.password ?? '' } : undefined,
    connectionTimeout: 10_000,
  });
  return {
    async send(mail) {
      await transport.sendMail({ from: smtp.from, ...mail });
    },
    close: () => transport.close(),
  };
}
