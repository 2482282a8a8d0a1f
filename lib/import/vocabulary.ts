// The controlled vocabularies of value rows, kept free of Drizzle so the browser worker stays small.
// tests/unit/import/vocabulary.test.ts checks they equal the enums of db/schema/values.ts.
export const BRANCH_VALUES = ['TO', 'LO'] as const;
export const ACTIVITY_VALUES = ['raman', 'ir', 'raman+ir', 'silent', 'acoustic'] as const;
export const TECHNIQUE_VALUES = ['raman', 'ir-reflectance', 'ir-absorption', 'ins', 'hyper-raman', 'calorimetry'] as const;
export const SAMPLE_FORM_VALUES = ['single-crystal', 'powder', 'film'] as const;

export type Branch = (typeof BRANCH_VALUES)[number];
export type Activity = (typeof ACTIVITY_VALUES)[number];
export type Technique = (typeof TECHNIQUE_VALUES)[number];
export type SampleForm = (typeof SAMPLE_FORM_VALUES)[number];
