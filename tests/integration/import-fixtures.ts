import { db } from '@/db/client';
import { material, method, source } from '@/db/schema';

/** Minimal catalogue rows for import tests: GaN-wz (4 atoms/fu), Si (1 atom/fu), one source, one method. */
export async function seedCatalogue(workspaceId: string) {
  const [gan] = await db
    .insert(material)
    .values({ workspaceId, name: 'GaN-wz', formula: 'GaN', reducedFormula: 'GaN', atomsPerFormulaUnit: 2, elementCounts: { Ga: 1, N: 1 }, spaceGroup: 186 })
    .returning();
  const [si] = await db
    .insert(material)
    .values({ workspaceId, name: 'Si', formula: 'Si', reducedFormula: 'Si', atomsPerFormulaUnit: 1, elementCounts: { Si: 1 }, spaceGroup: 227 })
    .returning();
  const [src] = await db.insert(source).values({ workspaceId, citeKey: 'azuhata1995', kind: 'journal-article', title: 'Azuhata et al. 1995' }).returning();
  const [calcSrc] = await db.insert(source).values({ workspaceId, citeKey: 'inhouse-2026', kind: 'computed-data-set', title: 'In-house runs' }).returning();
  const [pbesol] = await db.insert(method).values({ workspaceId, label: 'PBEsol-PAW-600', functional: 'PBEsol' }).returning();
  return { gan, si, src, calcSrc, pbesol };
}

export function bytesOf(text: string): Uint8Array {
  return new TextEncoder().encode(text);
}

export async function* chunksOf(bytes: Uint8Array, size = 7): AsyncGenerator<Uint8Array> {
  for (let i = 0; i < bytes.length; i += size) yield bytes.subarray(i, i + size);
}
