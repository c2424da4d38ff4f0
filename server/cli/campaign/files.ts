/** The recordings a campaign analyses: FILEs as given, and every recording under each DIR (recursively). */
import { readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { UsageError } from '../options';

/** The extensions the CLI reads (README, "Batch mode"); .txt is left out so a folder's notes are not read. */
export const RECORDING_EXTENSIONS = ['.wav', '.csv', '.tsv', '.mat', '.h5', '.hdf5', '.uff', '.unv'];

/** tags.csv in a campaign folder is the file tags, not a recording. */
export const TAGS_FILE_NAME = 'tags.csv';

function walk(dir: string, out: string[]): void {
  for (const entry of readdirSync(dir, { withFileTypes: true }).sort((a, b) => a.name.localeCompare(b.name))) {
    if (entry.name.startsWith('.')) continue;
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) walk(full, out);
    else if (entry.isFile() && RECORDING_EXTENSIONS.includes(path.extname(entry.name).toLowerCase())) out.push(full);
  }
}

export interface CampaignFiles {
  /** Absolute paths, each once, in a stable order */
  files: string[];
  /** The folder file names are given relative to (the one DIR, else the caller's folder) */
  root: string;
  /** True when root is the one DIR given (where a tags.csv belongs) */
  rootIsDir: boolean;
}

export function collectFiles(inputs: string[], cwd: string, exclude: string[] = []): CampaignFiles {
  const files: string[] = [];
  const dirs: string[] = [];
  for (const input of inputs) {
    let stat;
    try {
      stat = statSync(input);
    } catch {
      throw new UsageError(`${input} does not exist.`);
    }
    if (stat.isDirectory()) {
      dirs.push(input);
      const found: string[] = [];
      walk(input, found);
      files.push(...found.filter((f) => !(path.dirname(f) === input && path.basename(f).toLowerCase() === TAGS_FILE_NAME)));
    } else files.push(input);
  }
  const skip = new Set(exclude.map((f) => path.resolve(f)));
  const unique = [...new Set(files)].filter((f) => !skip.has(f));
  if (unique.length === 0) throw new UsageError(`No recordings (${RECORDING_EXTENSIONS.join(', ')}) in ${inputs.join(', ')}.`);
  return { files: unique, root: dirs.length === 1 ? dirs[0] : cwd, rootIsDir: dirs.length === 1 };
}

/** A file's name as the results and the project show it: relative to the root when inside it. */
export function relativeName(file: string, root: string): string {
  const rel = path.relative(root, file);
  return rel.startsWith('..') || path.isAbsolute(rel) ? file : rel.split(path.sep).join('/');
}
