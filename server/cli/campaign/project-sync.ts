/**
 * Keeps a campaign's project copy in step with RESULTS.jsonl: the campaign is created once (its id kept
 * beside the results, RESULTS.jsonl.campaign.json, so a rerun adds to the same campaign), and each result
 * is posted in order as it is written. Each file the project has taken is noted (RESULTS.jsonl.posted),
 * so a rerun posts only what did not get through. A post that fails for good is said on stderr; the
 * campaign goes on.
 */
import { appendFileSync, existsSync, readFileSync, writeFileSync } from 'node:fs';
import { fitInverter } from './fit-inverter';
import { ProjectClient, type CampaignResultPost, type FileTags, type ProjectTarget } from './project-client';

interface Sidecar {
  server: string;
  projectId: string;
  campaignId: string;
}

export class ProjectSync {
  private chain: Promise<void> = Promise.resolve();
  private readonly client: ProjectClient;
  campaignId = '';
  failedPosts = 0;
  private readonly posted = new Set<string>();
  private readonly postedPath: string;

  constructor(
    private readonly target: ProjectTarget,
    private readonly sidecarPath: string,
    retry?: { attempts: number; firstDelayMs: number },
  ) {
    this.client = new ProjectClient(target, retry);
    this.postedPath = sidecarPath.replace(/\.campaign\.json$/, '.posted');
  }

  /** True when the project has taken this file's result (in this run or an earlier one). */
  hasPosted(file: string): boolean {
    return this.posted.has(file);
  }

  async start(input: { name: string; preset: unknown; total: number; tags?: FileTags }): Promise<string> {
    if (existsSync(this.sidecarPath)) {
      try {
        const s = JSON.parse(readFileSync(this.sidecarPath, 'utf8')) as Sidecar;
        if (s.server === this.target.server && s.projectId === this.target.projectId && s.campaignId) {
          if (existsSync(this.postedPath)) for (const f of readFileSync(this.postedPath, 'utf8').split('\n')) if (f) this.posted.add(f);
          return (this.campaignId = s.campaignId);
        }
      } catch {
        // unreadable: a new campaign
      }
    }
    const { id } = await this.client.createCampaign(input);
    const sidecar: Sidecar = { server: this.target.server, projectId: this.target.projectId, campaignId: id };
    writeFileSync(this.sidecarPath, `${JSON.stringify(sidecar)}\n`);
    writeFileSync(this.postedPath, '');
    return (this.campaignId = id);
  }

  /** Queues one result's post; posts go out one at a time, in the order the results were written. */
  post(result: CampaignResultPost): void {
    const fitted = result.inverter === undefined ? result : { ...result, inverter: fitInverter(result.inverter) };
    this.chain = this.chain.then(() =>
      this.client.postResult(this.campaignId, fitted).then(
        () => {
          this.posted.add(result.file);
          appendFileSync(this.postedPath, `${result.file}\n`);
        },
        (e: unknown) => {
          this.failedPosts++;
          process.stderr.write(`campaign: the result of ${result.file} did not reach the project (a rerun tries again): ${(e as Error).message}\n`);
        },
      ),
    );
  }

  /** Waits for every queued post. */
  drain(): Promise<void> {
    return this.chain;
  }
}
