/**
 * @mentions in comment text. A handle is the local part of a member's e-mail
 * address or their name with spaces as dots ("@tomas.ferreira"); anything else,
 * a non-member included, is plain text.
 */

export interface MentionCandidate {
  userId: string;
  name: string;
  email: string;
}

// "@" must not follow a word character, so "lena@example.org" is not a mention.
const MENTION = /(^|[^\p{L}\p{N}_.@-])@([\p{L}\p{N}](?:[\p{L}\p{N}._-]*[\p{L}\p{N}])?)/gu;

export interface MentionMatch {
  handle: string;
  start: number;
  end: number;
}

/** Every @handle in the text, with where it stands (the "@" included). */
export function findMentions(body: string): MentionMatch[] {
  const out: MentionMatch[] = [];
  for (const m of body.matchAll(MENTION)) {
    const start = m.index + m[1].length;
    out.push({ handle: m[2], start, end: start + 1 + m[2].length });
  }
  return out;
}

function fold(value: string): string {
  return value.normalize('NFKD').replace(/\p{M}/gu, '').toLowerCase();
}

/** The handles a member answers to, folded (case and accents ignored). */
export function handlesOf(member: Pick<MentionCandidate, 'name' | 'email'>): string[] {
  const local = member.email.split('@')[0] ?? '';
  const dotted = fold(member.name).trim().split(/\s+/).filter(Boolean).join('.');
  return [...new Set([fold(local), dotted].filter(Boolean))];
}

/** The members mentioned in a text, each once, in order of first mention. */
export function resolveMentions<M extends MentionCandidate>(body: string, members: readonly M[]): M[] {
  const byHandle = new Map<string, M>();
  for (const m of members) for (const h of handlesOf(m)) if (!byHandle.has(h)) byHandle.set(h, m);
  const seen = new Set<string>();
  const out: M[] = [];
  for (const { handle } of findMentions(body)) {
    const member = byHandle.get(fold(handle));
    if (member && !seen.has(member.userId)) {
      seen.add(member.userId);
      out.push(member);
    }
  }
  return out;
}

export const COMMENT_MAX_CHARS = 5000;

/** A comment as stored: line endings made \n, outer whitespace trimmed. */
export function normaliseCommentBody(body: string): string {
  return body.replace(/\r\n?/g, '\n').trim();
}
