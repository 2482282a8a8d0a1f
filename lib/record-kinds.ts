/**
 * The fixed vocabularies of stored records. The schema declares its enum columns
 * from these, so pure code (import validation, forms, the API schemas) can use
 * them without importing the database layer.
 */
export const SOURCE_KINDS = ['journal-article', 'data-set', 'thesis', 'in-house-notebook', 'computed-data-set'] as const;
export const APPROACHES = ['perturbation', 'finite-displacement'] as const;
export const QUANTITIES = ['frequency', 'entropy', 'heat-capacity', 'eps-inf', 'eps-static', 'born-charge'] as const;
export const BRANCHES = ['TO', 'LO'] as const;
export const ACTIVITIES = ['raman', 'ir', 'raman+ir', 'silent', 'acoustic'] as const;
export const TECHNIQUES = ['raman', 'ir-reflectance', 'ir-absorption', 'ins', 'hyper-raman', 'calorimetry'] as const;
export const SAMPLE_FORMS = ['single-crystal', 'powder', 'film'] as const;
export const IMPORT_KINDS = ['measurements', 'calculations', 'dos', 'materials', 'methods', 'sources'] as const;
export const FLAG_KINDS = ['outlier', 'quality'] as const;
export const DECISION_KINDS = ['exclude-pair', 'exclude-measurement', 'keep'] as const;
export const THREAD_SUBJECTS = ['pair', 'measurement', 'calculation-set', 'material', 'revision'] as const;
export const TOKEN_ROLES = ['curator', 'contributor', 'reviewer'] as const;
export const MAIL_STATUSES = ['pending', 'sending', 'sent', 'failed'] as const;
export const JOB_STATUSES = ['queued', 'failed'] as const;
/** How an outbox row is delivered: an e-mail through the provider, or a signed POST to a watch's URL. */
export const OUTBOX_CHANNELS = ['email', 'webhook'] as const;
