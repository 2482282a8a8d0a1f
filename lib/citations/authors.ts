/**
 * The one display format for the people of a source, used by pages, decks,
 * minutes, e-mails and exports alike: initials before the family name
 * ("T. Azuhata, T. Sota and S. Nakamura"), particles kept ("J. D. van der Waals"),
 * organisations and names kept as written shown as they are.
 */
import type { PersonName } from './names';

/** "Takashi" → "T."; "Jean-Pierre" → "J.-P."; "K. P." stays; "Ségolène" → "S.". */
export function initialsOf(given: string): string {
  return given
    .split(/\s+/)
    .filter(Boolean)
    .map((word) =>
      word
        .split('-')
        .map((part) => {
          const letters = part.replace(/\./g, '');
          if (!letters) return part;
          // "Th." or "Ch." are initials already written that way.
          return part.endsWith('.') && letters.length <= 2 ? part : `${[...letters][0].toUpperCase()}.`;
        })
        .join('-'),
    )
    .join(' ');
}

export function familyOf(name: PersonName): string {
  if (name.literal) return name.literal;
  return [name.particle, name.family].filter(Boolean).join(' ');
}

/** One name: "T. Azuhata", "J. D. van der Waals", "M. W. Chase Jr.", "Halden Phonon Group". */
export function formatPersonName(name: PersonName): string {
  if (name.literal) return name.literal;
  return [name.given ? initialsOf(name.given) : null, familyOf(name), name.suffix].filter(Boolean).join(' ');
}

/** Family name first, as reference managers and sorting want it: "van der Waals, J. D." */
export function formatNameFamilyFirst(name: PersonName): string {
  if (name.literal) return name.literal;
  return [familyOf(name), name.suffix, name.given].filter(Boolean).join(', ');
}

/** "T. Azuhata", "M. Hass and B. W. Henvis", "A, B and C"; past `max` names: "A, B, C et al.". */
export function formatAuthors(names: readonly PersonName[] | null | undefined, max = Infinity): string {
  const list = (names ?? []).map(formatPersonName);
  if (list.length === 0) return '';
  if (list.length > max) return `${list.slice(0, Math.max(1, max)).join(', ')} et al.`;
  if (list.length === 1) return list[0];
  return `${list.slice(0, -1).join(', ')} and ${list[list.length - 1]}`;
}

/** For a short citation: "Azuhata et al.", "Hass and Henvis", "Parker". */
export function shortAuthors(names: readonly PersonName[] | null | undefined): string {
  const list = names ?? [];
  if (list.length === 0) return '';
  if (list.length === 1) return familyOf(list[0]);
  if (list.length === 2) return `${familyOf(list[0])} and ${familyOf(list[1])}`;
  return `${familyOf(list[0])} et al.`;
}

/** What the list is searched and sorted by: family names first, "; " between names. */
export function authorsSortText(names: readonly PersonName[] | null | undefined): string | null {
  const list = names ?? [];
  return list.length ? list.map(formatNameFamilyFirst).join('; ') : null;
}
