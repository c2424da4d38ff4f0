import { OutboxStore } from '../../server/mail/outbox-store';
import type { OutboxMessage } from '../../server/schemas/outbox';
import { testConfig } from './test-db';

/** Waits for the local SMTP fake to hold a message to `to` matching `subject` (mail may be sent after the answer). */
export async function waitForMail(to: string, subject: RegExp, timeoutMs = 10_000): Promise<OutboxMessage> {
  const store = new OutboxStore(testConfig().smtp.outboxDir);
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const found = store.list().find((m) => m.to.includes(to) && subject.test(m.subject));
    if (found) return found;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no mail to ${to} matching ${subject} within ${timeoutMs} ms`);
}

export const tokenFrom = (link: string) => {
  const url = new URL(link);
  return url.searchParams.get('token') ?? url.pathname.split('/').pop()!;
};
