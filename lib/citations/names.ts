/**
 * Person names of sources: parsed from what a person types or a file holds into
 * CSL-style parts, through citation-js's name parser, with the two patterns it
 * does not know: "Family G." (initials after the family name, common in physics
 * reference lists) and a suffix after the family name ("M. W. Chase Jr.").
 */
import { parse as parseCslName, type CslName } from '@citation-js/name';

export interface PersonName {
  family?: string;
  given?: string;
  /** "van der", "de la", "von": kept apart so styles can place and sort it. */
  particle?: string;
  suffix?: string;
  /** An organisation, or a name kept exactly as written. */
  literal?: string;
  /** The parser could not split this name: it is kept as written and shown for review. */
  review?: boolean;
}

export const MAX_NAMES = 500;
export const MAX_NAME_CHARS = 300;

const SUFFIX = /^(?:Jr\.?|Sr\.?|II|III|IV|V)$/;
const INITIALS = /^(?:\p{Lu}\.?(?:-\p{Lu}\.?)*|\p{Lu}{2,3})$/u;
const PARTICLE = /^(?:van|von|der|den|de|del|della|di|da|du|des|la|le|ter|ten|zu|dos|das|y|af|av)$/;
const ORGANISATION = /\b(?:group|consortium|collaboration|institute|institution|laborator(?:y|ies)|university|team|project|society|committee|council|agency|centre|center|association|office|bureau|survey|task force|codata|nist|iupac)\b/i;
const NOT_A_NAME = /[\d()[\]@#&/\\:]/;

function clean(text: string): string {
  return text.replace(/\s+/g, ' ').trim();
}

/** "JD" → "J. D."; "T" → "T."; "J.-P." stays. Only for tokens already known to be initials. */
function dotted(token: string): string {
  if (/^\p{Lu}{2,3}$/u.test(token)) return [...token].map((c) => `${c}.`).join(' ');
  return token.replace(/(\p{Lu})(?!\.)(?=-|$)/gu, '$1.');
}

function compact(name: PersonName): PersonName {
  const out: PersonName = {};
  for (const key of ['family', 'given', 'particle', 'suffix', 'literal'] as const) {
    const v = name[key] && clean(name[key]!);
    if (v) out[key] = v;
  }
  if (name.review) out.review = true;
  return out;
}

function fromCsl(csl: CslName): PersonName {
  const particle = [csl['dropping-particle'], csl['non-dropping-particle']].filter(Boolean).join(' ');
  return compact({ family: csl.family, given: csl.given, particle, suffix: csl.suffix, literal: csl.literal });
}

function asWritten(text: string): PersonName {
  return { literal: text, review: true };
}

/** "Azuhata T.", "van der Waals J. D.", "Ananthanarayanan K. P." → family first, then initials. */
function familyThenInitials(tokens: string[]): PersonName | null {
  let split = tokens.length;
  while (split > 0 && INITIALS.test(tokens[split - 1])) split--;
  if (split === 0 || split === tokens.length) return null;
  const head = tokens.slice(0, split);
  // "T. Azuhata" has its initials first: not this pattern.
  if (INITIALS.test(head[head.length - 1]) || head.some((t) => INITIALS.test(t))) return null;
  let p = 0;
  while (p < head.length - 1 && PARTICLE.test(head[p])) p++;
  return compact({ particle: head.slice(0, p).join(' '), family: head.slice(p).join(' '), given: tokens.slice(split).map(dotted).join(' ') });
}

/** One name as a person typed it or a file holds it. */
export function parsePersonName(raw: string): PersonName {
  const text = clean(raw);
  if (!text) return asWritten(raw);
  const braced = /^\{(.+)\}$/.exec(text);
  if (braced) return { literal: clean(braced[1]) };
  if (ORGANISATION.test(text)) return { literal: text.replace(/,\s*$/, '') };
  if (text.length > MAX_NAME_CHARS || NOT_A_NAME.test(text)) return asWritten(text);
  if (text.includes(',')) {
    const parts = text.split(',').map(clean);
    if (parts.length > 3 || parts.some((p) => !p)) return asWritten(text);
    // "Chase, M. W., Jr." (RIS order) and "Chase, Jr., M. W." (BibTeX order) are the same person.
    if (parts.length === 3 && SUFFIX.test(parts[2]) && !SUFFIX.test(parts[1])) return compact({ ...fromCsl(parseCslName(`${parts[0]}, ${parts[1]}`)), suffix: parts[2] });
    const name = fromCsl(parseCslName(text));
    return name.family && name.given ? name : asWritten(text);
  }
  let tokens = text.split(' ');
  let suffix: string | undefined;
  if (tokens.length > 2 && SUFFIX.test(tokens[tokens.length - 1])) {
    suffix = tokens[tokens.length - 1];
    tokens = tokens.slice(0, -1);
  }
  if (tokens.length < 2 || tokens.length > 6) return asWritten(text);
  const reversed = familyThenInitials(tokens);
  if (reversed) return compact({ ...reversed, suffix });
  const name = fromCsl(parseCslName(tokens.join(' ')));
  if (!name.family || !name.given || /^\p{Ll}/u.test(name.family)) return asWritten(text);
  return compact({ ...name, given: name.given.split(' ').map((t) => (INITIALS.test(t) ? dotted(t) : t)).join(' '), suffix });
}

/** Splits a list of names: one per line, or separated by ";", or by " and " (BibTeX), or by commas between "Given Family" names. */
export function splitNameList(text: string): string[] {
  const trimmed = text.trim();
  if (!trimmed) return [];
  let parts: string[];
  if (/[\n;]/.test(trimmed)) parts = trimmed.split(/\s*[\n;]\s*/);
  else if (/\s(?:and|&)\s/.test(trimmed)) parts = trimmed.replace(/,\s*(?:and|&)\s+/g, ' and ').split(/\s+(?:and|&)\s+/);
  else parts = [trimmed];
  return parts.flatMap(splitCommaList).map(clean).filter(Boolean);
}

const allInitials = (piece: string) => piece.split(' ').every((t) => INITIALS.test(t));

/** "T. Azuhata" or "Azuhata T.": a whole name with its initials on one side. */
function wholeNameWithInitials(piece: string): boolean {
  const tokens = piece.split(' ');
  return tokens.length >= 2 && !allInitials(piece) && (INITIALS.test(tokens[0]) || INITIALS.test(tokens[tokens.length - 1]));
}

/**
 * "T. Azuhata, T. Sota, K. Suzuki" is three names; "Azuhata, T." and
 * "van der Waals, Johannes" are one; "Azuhata, T., Sota, T." is two.
 */
function splitCommaList(part: string): string[] {
  const pieces = part.split(',').map(clean).filter(Boolean);
  if (pieces.length < 2) return [part];
  if (pieces.length === 2) return pieces.every(wholeNameWithInitials) ? pieces : [part];
  if (pieces.length % 2 === 0 && pieces.every((p, i) => (i % 2 === 1) === allInitials(p))) {
    const out: string[] = [];
    for (let i = 0; i < pieces.length; i += 2) out.push(`${pieces[i]}, ${pieces[i + 1]}`);
    return out;
  }
  if (pieces.every((p) => p.includes(' ') && !allInitials(p))) return pieces;
  return [part];
}

export function parseNameList(text: string): PersonName[] {
  return splitNameList(text).map(parsePersonName);
}

/** Names that still need a person to look at them. */
export function namesToReview(names: readonly PersonName[] | null | undefined): PersonName[] {
  return (names ?? []).filter((n) => n.review);
}
