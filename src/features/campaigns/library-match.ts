import type { LibraryEntry } from '../library/api/library-store';
import { baseName } from './result-format';

/**
 * The library entry for a campaign file: matched by the file's own name (the library keeps names, not the
 * folders the campaign saw), the most recently added when several share it.
 */
export function libraryEntryFor(entries: LibraryEntry[] | undefined, file: string): LibraryEntry | null {
  const name = baseName(file);
  const matches = (entries ?? []).filter((e) => e.name === name);
  return matches.sort((a, b) => b.addedAt.localeCompare(a.addedAt))[0] ?? null;
}
