/** The reference formats sources export to (and import from). */
export const EXPORT_FORMATS = {
  bibtex: { extension: 'bib', contentType: 'application/x-bibtex; charset=utf-8', label: 'BibTeX' },
  ris: { extension: 'ris', contentType: 'application/x-research-info-systems; charset=utf-8', label: 'RIS' },
  'csl-json': { extension: 'json', contentType: 'application/vnd.citationstyles.csl+json; charset=utf-8', label: 'CSL-JSON' },
} as const;
export type ExportFormat = keyof typeof EXPORT_FORMATS;
export const EXPORT_FORMAT_NAMES = Object.keys(EXPORT_FORMATS) as ExportFormat[];
