import type { AppConfig } from '../config';
import { startSmtpFake } from '../mail/smtp-fake';
import { onShutdown } from './shutdown';

/** Starts the local SMTP fake unless a real SMTP host is configured; returns a line for the banner. */
export async function startMailFakeIfWanted(config: AppConfig): Promise<string | null> {
  if (!config.smtp.useFake) return `  Mail goes to ${config.smtp.host}:${config.smtp.port}.`;
  const fake = await startSmtpFake(config.smtp.port, config.smtp.outboxDir);
  onShutdown(() => fake.close());
  return `  Mail goes to the local fake on 127.0.0.1:${fake.port}; read it at ${config.publicOrigin}/outbox`;
}
