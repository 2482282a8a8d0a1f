import 'server-only';
import { and, eq, inArray, isNull } from 'drizzle-orm';
import { db } from '@/db/client';
import { calculation, importBatch, material } from '@/db/schema';
import { insertImportBatch, writeImportAudit, type ImportActor, type ImportOutcome } from '@/db/queries/imports';
import { INSERT_CHUNK_ROWS, rowHash, type DuplicateRow } from '@/lib/import/row-validator';
import type { ComputedDosValue } from '@/lib/import/dos-compute';
import { MAX_REPORTED_ERRORS } from '@/lib/import/errors';

/** Atoms in the cell of every live material, for the wizard's DOS preview. */
export async function listAtomsInCell(workspaceId: string): Promise<Map<string, number | null>> {
  const rows = await db
    .select({ id: material.id, atomsInCell: material.atomsInCell })
    .from(material)
    .where(and(eq(material.workspaceId, workspaceId), isNull(material.retractedAt)));
  return new Map(rows.map((r) => [r.id, r.atomsInCell]));
}

export interface DosImportOutcome extends ImportOutcome {
  /** DOS blocks (material × method) in the file, temperatures evaluated, values computed. */
  dosCount: number;
  temperatures: number[];
  computedCount: number;
}

/**
 * Stores the entropies and heat capacities computed from a DOS file, with its
 * import record (kind 'dos') and one audit row, in ONE transaction. Values
 * identical to live calculation rows are skipped and reported (same row hash as
 * typed-in rows). A concurrent import of the same bytes is refused as a duplicate file.
 */
export async function storeDosValues(args: {
  workspaceId: string;
  actor: ImportActor;
  file: { fileName: string | null; sha256: string; byteCount: number; via: 'wizard' | 'api' };
  /** The file's data rows. */
  rowCount: number;
  values: readonly ComputedDosValue[];
  /** The file row each value's DOS block starts at, by block index (for the duplicate report). */
  rowOfBlock: readonly number[];
  /** What the audit row records about the file beyond the counts (temperatures, the DOS blocks). */
  auditDetails: Record<string, unknown>;
}): Promise<Pick<ImportOutcome, 'importId' | 'insertedCount' | 'duplicateCount' | 'duplicates'>> {
  const { workspaceId, actor, file, values, rowOfBlock } = args;
  const importId = crypto.randomUUID();
  const duplicates: DuplicateRow[] = [];
  let duplicateCount = 0;
  let insertedCount = 0;

  await db.transaction(async (tx) => {
    await insertImportBatch(tx, { id: importId, workspaceId, kind: 'dos', fileName: file.fileName, sha256: file.sha256, byteCount: file.byteCount, rowCount: args.rowCount, via: file.via }, actor);

    const hashed = values.map((v) => ({ v, hash: rowHash(v.identity) }));
    const known = new Set<string>();
    for (let i = 0; i < hashed.length; i += INSERT_CHUNK_ROWS) {
      const chunk = hashed.slice(i, i + INSERT_CHUNK_ROWS).map((h) => h.hash);
      const rows = await tx
        .select({ hash: calculation.rowHash })
        .from(calculation)
        .where(and(eq(calculation.workspaceId, workspaceId), isNull(calculation.retractedAt), inArray(calculation.rowHash, chunk)));
      for (const r of rows) known.add(r.hash);
    }
    const fresh: Array<{ v: ComputedDosValue; hash: string }> = [];
    for (const h of hashed) {
      if (known.has(h.hash)) {
        duplicateCount++;
        if (duplicates.length < MAX_REPORTED_ERRORS) {
          duplicates.push({
            row: rowOfBlock[h.v.blockIndex],
            reason: `The ${h.v.quantity} at ${h.v.temperatureK} K (${h.v.valueText} J/mol/K) is identical to a row already in the workspace; skipped.`,
          });
        }
      } else {
        known.add(h.hash);
        fresh.push(h);
      }
    }
    const notes = `computed from phonon DOS (import ${importId})`;
    for (let i = 0; i < fresh.length; i += INSERT_CHUNK_ROWS) {
      await tx.insert(calculation).values(
        fresh.slice(i, i + INSERT_CHUNK_ROWS).map(({ v, hash }) => ({
          workspaceId,
          materialId: v.materialId,
          sourceId: v.sourceId,
          methodId: v.methodId,
          importId,
          quantity: v.quantity,
          value: v.value,
          valueText: v.valueText,
          unit: v.unit,
          temperatureK: v.temperatureK,
          notes,
          rowHash: hash,
          contributorId: actor.userId,
        })),
      );
      insertedCount += Math.min(INSERT_CHUNK_ROWS, fresh.length - i);
      await new Promise<void>((resolve) => setImmediate(resolve));
    }

    await tx.update(importBatch).set({ insertedCount, duplicateCount }).where(eq(importBatch.id, importId));
    await writeImportAudit(
      workspaceId,
      actor,
      importId,
      {
        kind: 'dos',
        fileName: file.fileName,
        sha256: file.sha256,
        byteCount: file.byteCount,
        rowCount: args.rowCount,
        insertedCount,
        duplicateCount,
        via: file.via,
        ...args.auditDetails,
      },
      tx,
    );
  });

  return { importId, insertedCount, duplicateCount, duplicates };
}
