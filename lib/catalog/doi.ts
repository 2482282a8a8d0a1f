/**
 * DOIs as the DOI Handbook defines them: "10." + a registrant code of digits
 * (dot-separated) + "/" + a suffix of printable characters. DOIs are
 * case-insensitive, so they are stored lower-case: two spellings of one DOI
 * then compare equal.
 */
const DOI_PATTERN = /^10\.\d{4,9}(?:\.\d+)*\/\S+$/;
const DOI_PREFIXES = [/^(?:https?:\/\/)?(?:dx\.)?doi\.org\//i, /^doi:\s*/i, /^doi\s+/i];

export type DoiResult = { ok: true; doi: string } | { ok: false; message: string };

/** Accepts a bare DOI, "doi:10.…" or "https://doi.org/10.…"; returns the bare, lower-case DOI or the reason it is not one. */
export function normalizeDoi(input: string): DoiResult {
  let value = input.trim();
  for (const prefix of DOI_PREFIXES) value = value.replace(prefix, '');
  if (/%[0-9a-f]{2}/i.test(value)) {
    try {
      value = decodeURIComponent(value);
    } catch {
      // Not percent-encoding after all: checked as it is below.
    }
  }
  if (value === '') return { ok: false, message: 'A DOI is empty.' };
  if (!DOI_PATTERN.test(value)) {
    return { ok: false, message: `"${input.trim()}" is not a DOI: expected 10.NNNN/… (e.g. 10.1103/PhysRev.155.712).` };
  }
  return { ok: true, doi: value.toLowerCase() };
}

/** The resolver link shown for a DOI. */
export function doiUrl(doi: string): string {
  return `https://doi.org/${doi.split('/').map(encodeURIComponent).join('/').replace(/%2F/g, '/')}`;
}
