import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ACTIVITIES, BRANCHES, SAMPLE_FORMS, TECHNIQUES } from '@/db/schema/values';
import { ACTIVITY_VALUES, BRANCH_VALUES, SAMPLE_FORM_VALUES, TECHNIQUE_VALUES } from '@/lib/import/vocabulary';
import { CALCULATION_CATALOG_COLUMNS, CALCULATION_COLUMNS, MEASUREMENT_COLUMNS } from '@/lib/import/columns';
import { MATERIAL_IMPORT_COLUMNS, METHOD_IMPORT_COLUMNS, SOURCE_IMPORT_COLUMNS } from '@/lib/import/catalog-columns';
import { templateCsv, templateFileName } from '@/lib/import/templates';
import { resolveHeader } from '@/lib/import/header';

describe('import vocabulary', () => {
  it('equals the enums of the database schema', () => {
    expect(BRANCH_VALUES).toEqual(BRANCHES);
    expect(ACTIVITY_VALUES).toEqual(ACTIVITIES);
    expect(TECHNIQUE_VALUES).toEqual(TECHNIQUES);
    expect(SAMPLE_FORM_VALUES).toEqual(SAMPLE_FORMS);
  });
});

describe('templates', () => {
  for (const kind of ['measurements', 'calculations', 'materials', 'methods', 'sources'] as const) {
    it(`data/templates/${templateFileName(kind)} is the generated template and its header maps completely`, () => {
      const file = readFileSync(`data/templates/${templateFileName(kind)}`, 'utf8');
      expect(file).toBe(templateCsv(kind));
      const header = file.split('\r\n')[0].split(',');
      const resolved = resolveHeader(kind, header);
      expect(resolved.errors).toEqual([]);
      expect(resolved.ignored).toEqual([]);
    });
  }

  it('every column is documented in data/templates/README.md', () => {
    const readme = readFileSync('data/templates/README.md', 'utf8');
    for (const c of [...MEASUREMENT_COLUMNS, ...CALCULATION_COLUMNS, ...CALCULATION_CATALOG_COLUMNS, ...MATERIAL_IMPORT_COLUMNS, ...METHOD_IMPORT_COLUMNS, ...SOURCE_IMPORT_COLUMNS])
      expect(readme, c.key).toContain(`\`${c.key}\``);
  });
});
