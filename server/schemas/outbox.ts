/** A message the local SMTP fake received (development and tests only). */
export interface OutboxMessage {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  /** Links found in the text part, for the Outbox page's buttons and for tests. */
  links: string[];
}
