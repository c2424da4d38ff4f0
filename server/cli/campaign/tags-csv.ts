/** TAGS.csv: a header `file,<tag>,<tag>…` and one row per file (relative to DIR) with its tag values. */
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { UsageError } from '../options';
import type { FileTags } from './project-client';

export function readTagsCsv(file: string): FileTags {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch {
    throw new UsageError(`--tags ${file} cannot be read.`);
  }
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: true });
  const [header, ...rows] = parsed.data;
  if (!header || header[0]?.trim() !== 'file' || header.length < 2) {
    throw new UsageError(`${file}: the first line must be the header file,<tag>,<tag>… (e.g. file,firmware,load).`);
  }
  const names = header.slice(1).map((h) => h.trim());
  const tags: FileTags = {};
  rows.forEach((row, i) => {
    if (row.length !== header.length) throw new UsageError(`${file} line ${i + 2}: ${row.length} fields where the header has ${header.length}.`);
    const name = row[0].trim().split('\\').join('/');
    if (!name) throw new UsageError(`${file} line ${i + 2}: the file field is empty.`);
    tags[name] = Object.fromEntries(names.map((n, k) => [n, row[k + 1].trim()]));
  });
  return tags;
}
