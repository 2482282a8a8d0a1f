/**
 * Splits comment text into plain text, links and mentions. Only absolute
 * http(s) URLs become links; everything is rendered as text nodes by the caller.
 */
import { findMentions } from './mentions';

export type CommentToken = { kind: 'text'; text: string } | { kind: 'link'; text: string; href: string } | { kind: 'mention'; text: string; handle: string };

const URL_CANDIDATE = /\bhttps?:\/\/[^\s<>"'`]+/gi;
const TRAILING = /[.,;:!?*_~]+$/;

function trimUrl(raw: string): string {
  let url = raw.replace(TRAILING, '');
  // a closing bracket belongs to the URL only when it opens one too ("…/Foo_(bar)")
  while (/[)\]]$/.test(url)) {
    const close = url.at(-1)!;
    const open = close === ')' ? '(' : '[';
    if (url.split(open).length >= url.split(close).length) break;
    url = url.slice(0, -1).replace(TRAILING, '');
  }
  return url;
}

/** The href when the text is a safe absolute http(s) URL, else null. */
export function safeHref(text: string): string | null {
  try {
    const url = new URL(text);
    if (url.protocol !== 'http:' && url.protocol !== 'https:') return null;
    if (!url.hostname) return null;
    return url.href;
  } catch {
    return null;
  }
}

function pushText(out: CommentToken[], text: string) {
  if (!text) return;
  const last = out.at(-1);
  if (last?.kind === 'text') last.text += text;
  else out.push({ kind: 'text', text });
}

function withMentions(out: CommentToken[], text: string) {
  let at = 0;
  for (const m of findMentions(text)) {
    pushText(out, text.slice(at, m.start));
    out.push({ kind: 'mention', text: text.slice(m.start, m.end), handle: m.handle });
    at = m.end;
  }
  pushText(out, text.slice(at));
}

export function tokenizeComment(body: string): CommentToken[] {
  const out: CommentToken[] = [];
  let at = 0;
  for (const m of body.matchAll(URL_CANDIDATE)) {
    const text = trimUrl(m[0]);
    const href = safeHref(text);
    if (!href) continue;
    withMentions(out, body.slice(at, m.index));
    out.push({ kind: 'link', text, href });
    at = m.index + text.length;
  }
  withMentions(out, body.slice(at));
  return out;
}
