/**
 * `campaign DIR|FILE… --preset PRESET.json [--workers N] [--out RESULTS.jsonl] [--queue redis://HOST:PORT]
 * [--name NAME] [--tags TAGS.csv] [--project ID --server URL --token TOKEN]`: the inverter analysis on
 * every recording, each result one line of RESULTS.jsonl as it finishes; a rerun skips the files already
 * there. Embedded (worker threads here) or over a Redis queue (`analyze-worker` processes). Prints
 * `{"files","ok","failed","skipped","seconds","out"}`.
 */
import { createHash } from 'node:crypto';
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import path from 'node:path';
import type { Outcome } from '../campaign/analyse-one';
import { runEmbedded } from '../campaign/embedded-runner';
import { collectFiles, relativeName, TAGS_FILE_NAME } from '../campaign/files';
import { checkPresetOptions, presetOptions, readPreset } from '../campaign/preset';
import { Progress } from '../campaign/progress';
import { ProjectSync } from '../campaign/project-sync';
import { runQueued } from '../campaign/queue-runner';
import { checkRedisUrl } from '../campaign/redis-connection';
import { ResultsLog } from '../campaign/results-log';
import { readTagsCsv } from '../campaign/tags-csv';
import type { FileTags } from '../campaign/project-client';
import { type Options, UsageError } from '../options';

export interface CampaignSummary {
  files: number;
  ok: number;
  failed: number;
  skipped: number;
  seconds: number;
  out: string;
  campaignId?: string;
  interrupted?: true;
}

/** The campaign's id on the queue: the same preset written to the same results file is the same campaign. */
function campaignKey(options: Record<string, string | true>, out: string): string {
  const sorted = Object.fromEntries(Object.entries(options).sort(([a], [b]) => a.localeCompare(b)));
  return createHash('sha256').update(`${JSON.stringify(sorted)}\n${out}`).digest('hex').slice(0, 16);
}

function projectTarget(o: Options) {
  const given = ['project', 'server', 'token'].filter((k) => o.has(k));
  if (given.length === 0) return null;
  if (given.length < 3) throw new UsageError('--project, --server and --token go together: give all three to register the campaign.');
  return { projectId: o.string('project'), server: o.string('server'), token: o.string('token') };
}

export async function campaignCommand(inputs: string[], o: Options, signal: AbortSignal): Promise<CampaignSummary> {
  const cwd = process.env.INIT_CWD ?? process.cwd();
  const presetFile = path.resolve(cwd, o.string('preset'));
  const preset = readPreset(presetFile);
  const options = presetOptions(preset);
  checkPresetOptions(options, presetFile);
  const workers = o.integer('workers', availableParallelism(), 1);
  const out = path.resolve(cwd, o.string('out', 'campaign-results.jsonl'));
  const queue = o.has('queue') ? checkRedisUrl(o.string('queue')).href : null;
  const target = projectTarget(o);
  const explicitTags = o.has('tags') ? path.resolve(cwd, o.string('tags')) : null;
  const { files, root, rootIsDir } = collectFiles(inputs, cwd, [out, presetFile, ...(explicitTags ? [explicitTags] : [])]);
  const tagsFile = explicitTags ?? (rootIsDir && existsSync(path.join(root, TAGS_FILE_NAME)) ? path.join(root, TAGS_FILE_NAME) : null);
  const tags: FileTags | undefined = tagsFile ? readTagsCsv(tagsFile) : undefined;

  const log = new ResultsLog(out);
  const todo = files.filter((f) => !log.has(f));
  const progress = new Progress(todo.length);
  let sync: ProjectSync | null = null;
  try {
    if (target) {
      sync = new ProjectSync(target, `${out}.campaign.json`);
      const name = o.has('name') ? o.string('name') : `${path.basename(root)} ${new Date().toISOString().slice(0, 16).replace('T', ' ')}`;
      const forProject = tags ? Object.fromEntries(files.map((f) => relativeName(f, root)).filter((n) => tags[n]).map((n) => [n, tags[n]])) : undefined;
      await sync.start({ name, preset, total: files.length, ...(forProject ? { tags: forProject } : {}) });
      // a rerun posts what an earlier run wrote but could not post
      for (const f of files) {
        const r = log.results.get(f);
        if (r && !sync.hasPosted(relativeName(f, root))) sync.post({ ...r, file: relativeName(f, root), ...(tags?.[relativeName(f, root)] ? { tags: tags[relativeName(f, root)] } : {}) });
      }
    }
    let ok = 0;
    let failed = 0;
    const onResult = (file: string, outcome: Outcome) => {
      const result = outcome.ok ? { file, ok: true, inverter: outcome.inverter } : { file, ok: false, error: outcome.error };
      if (!log.write(result)) return; // written once per file, whatever the queue reports twice
      if (outcome.ok) ok++;
      else failed++;
      progress.finished(relativeName(file, root), outcome.ok);
      const name = relativeName(file, root);
      sync?.post({ ...result, file: name, ...(tags?.[name] ? { tags: tags[name] } : {}) });
    };
    if (todo.length > 0) {
      if (queue) await runQueued(queue, campaignKey(options, out), todo, options, onResult, signal);
      else await runEmbedded(todo, options, workers, onResult, signal);
    }
    await sync?.drain();
    return {
      files: files.length,
      ok,
      failed,
      skipped: files.length - todo.length,
      seconds: Math.round(progress.seconds * 100) / 100,
      out,
      ...(sync ? { campaignId: sync.campaignId } : {}),
      ...(signal.aborted ? { interrupted: true as const } : {}),
    };
  } finally {
    log.close();
  }
}
