/**
 * @handle mentions. A member answers to two handles: the local part of their e-mail (before the @) and
 * their first name, both compared without regard to case.
 */

// An @ that starts a word (not the middle of an e-mail address), then letters, digits and . _ + -
const MENTION = /(?<![\p{L}\p{N}._+-])@([\p{L}\p{N}][\p{L}\p{N}._+-]*)/gu;

const fold = (s: string) => s.toLocaleLowerCase('en');

/** The handles written in a text, lower-cased; a trailing full stop or dash belongs to the sentence. */
export function mentionedHandles(text: string): Set<string> {
  const out = new Set<string>();
  for (const m of text.matchAll(MENTION)) {
    const handle = m[1].replace(/[._+-]+$/u, '');
    if (handle) out.add(fold(handle));
  }
  return out;
}

export function handlesOf(member: { email: string; name: string }): string[] {
  const local = member.email.split('@')[0];
  const first = member.name.trim().split(/\s+/)[0] ?? '';
  return [...new Set([fold(local), fold(first)].filter(Boolean))];
}

/** The members a text mentions. */
export function mentionedMembers<M extends { email: string; name: string }>(text: string, members: M[]): M[] {
  const handles = mentionedHandles(text);
  if (!handles.size) return [];
  return members.filter((m) => handlesOf(m).some((h) => handles.has(h)));
}
