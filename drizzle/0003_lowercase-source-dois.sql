-- DOIs are case-insensitive: store them lower-case so two spellings of one DOI compare equal (lib/catalog/doi.ts).
UPDATE `source` SET `doi` = lower(trim(`doi`)) WHERE `doi` IS NOT NULL;
