/**
 * Registering a campaign with a Fanlight project (tracker issue #18): creates the campaign, then posts each
 * file's result as it finishes. A personal API token goes in the Bearer header; every post carries an
 * Idempotency-Key, and a network error or a 5xx answer is tried again after 0.5, 1, 2 … s.
 */
import { randomUUID } from 'node:crypto';
import { UsageError } from '../options';

export type FileTags = Record<string, Record<string, string>>;

export interface ProjectTarget {
  server: string;
  projectId: string;
  token: string;
}

export interface CampaignResultPost {
  file: string;
  ok: boolean;
  inverter?: unknown;
  error?: string;
  tags?: Record<string, string>;
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

export class ProjectClient {
  private readonly base: string;

  constructor(
    private readonly target: ProjectTarget,
    private readonly retry = { attempts: 6, firstDelayMs: 500 },
  ) {
    let u: URL;
    try {
      u = new URL(target.server);
    } catch {
      throw new UsageError(`--server "${target.server}" is not a URL; give e.g. http://localhost:3000.`);
    }
    if (!/^flt_[A-Za-z0-9_-]{43}$/.test(target.token)) throw new UsageError('--token must be a personal API token (flt_ and 43 more characters), made on the profile page.');
    this.base = `${u.origin}${u.pathname.replace(/\/$/, '')}/api/projects/${encodeURIComponent(target.projectId)}/campaigns`;
  }

  /** POST with one Idempotency-Key across its retries, so a retried post is stored once. */
  private async post<T>(url: string, body: unknown): Promise<T> {
    const key = randomUUID();
    let delay = this.retry.firstDelayMs;
    for (let attempt = 1; ; attempt++) {
      let res: Response | null = null;
      let failure: string;
      try {
        res = await fetch(url, {
          method: 'POST',
          headers: { Authorization: `Bearer ${this.target.token}`, 'Content-Type': 'application/json', 'Idempotency-Key': key },
          body: JSON.stringify(body),
        });
        if (res.ok) return (await res.json()) as T;
        const text = await res.text();
        let message = text.slice(0, 200);
        try {
          message = (JSON.parse(text) as { error?: { message?: string; code?: string } }).error?.message ?? message;
        } catch {
          // not JSON: the text itself
        }
        failure = `${res.status} ${message.replace(/\.$/, '')}`;
        if (res.status < 500) throw new ProjectError(`The server refused ${url.replace(this.base, 'the campaign')}: ${failure}.`);
      } catch (e) {
        if (e instanceof ProjectError) throw e;
        failure = res ? failure! : (e as Error).message;
      }
      if (attempt >= this.retry.attempts) throw new Error(`The server did not take ${url} after ${attempt} tries (${failure}).`);
      await sleep(delay);
      delay *= 2;
    }
  }

  async createCampaign(input: { name: string; preset: unknown; total: number; tags?: FileTags }): Promise<{ id: string }> {
    const r = await this.post<{ campaign: { id: string | number } }>(this.base, input);
    return { id: String(r.campaign.id) };
  }

  async postResult(campaignId: string, result: CampaignResultPost): Promise<void> {
    await this.post(`${this.base}/${encodeURIComponent(campaignId)}/results`, result);
  }
}

/** The server said no (4xx: a revoked or expired token, no access, a bad field): bad input, exit 2. */
export class ProjectError extends UsageError {}
