/** Workspace addresses: lower-case letters, digits and single hyphens, 2–48 characters. */
export const SLUG_MAX = 48;

/**
 * The address a name suggests: accents dropped (Ångström → angstrom), every run of
 * other characters one hyphen, at most SLUG_MAX characters, cut at a hyphen when it can.
 */
export function slugFromName(name: string): string {
  const plain = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/ß/g, 'ss')
    .replace(/[æÆ]/g, 'ae')
    .replace(/[øØ]/g, 'o')
    .replace(/[łŁ]/g, 'l')
    .toLowerCase()
    .replace(/&/g, ' and ')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '');
  if (plain.length <= SLUG_MAX) return plain;
  const cut = plain.slice(0, SLUG_MAX);
  const lastHyphen = cut.lastIndexOf('-');
  return (lastHyphen >= 2 ? cut.slice(0, lastHyphen) : cut).replace(/-+$/, '');
}
