declare module '@citation-js/name' {
  export interface CslName {
    family?: string;
    given?: string;
    suffix?: string;
    'non-dropping-particle'?: string;
    'dropping-particle'?: string;
    literal?: string;
  }
  /** "Given Family", "Family, Given" or "Family, Suffix, Given" → a CSL name. */
  export function parse(name: string): CslName;
  export function format(name: CslName, reversed?: boolean): string;
}
