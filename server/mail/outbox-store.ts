/**
 * The local SMTP fake's mailbox: one JSON file a message in a folder (development and tests only).
 * A folder rather than a table so the fake needs no database and survives a database reset.
 */
import { mkdirSync, readdirSync, readFileSync, writeFileSync, renameSync } from 'node:fs';
import path from 'node:path';
import type { OutboxMessage } from '../schemas/outbox';

const LINK = /https?:\/\/[^\s<>"')]+/g;

export const linksIn = (text: string) => [...new Set(text.match(LINK) ?? [])];

export class OutboxStore {
  constructor(private readonly dir: string) {}

  save(message: Omit<OutboxMessage, 'links'>): OutboxMessage {
    mkdirSync(this.dir, { recursive: true });
    const full: OutboxMessage = { ...message, links: linksIn(message.text) };
    const file = path.join(this.dir, `${message.receivedAt.replace(/[:.]/g, '-')}-${message.id}.json`);
    // write then rename, so a reader never sees half a message
    writeFileSync(`${file}.tmp`, JSON.stringify(full, null, 2));
    renameSync(`${file}.tmp`, file);
    return full;
  }

  /** Newest first. */
  list(limit = 200): OutboxMessage[] {
    let names: string[];
    try {
      names = readdirSync(this.dir).filter((f) => f.endsWith('.json'));
    } catch {
      return [];
    }
    return names
      .sort()
      .reverse()
      .slice(0, limit)
      .map((f) => JSON.parse(readFileSync(path.join(this.dir, f), 'utf8')) as OutboxMessage);
  }
}
