import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { and, count, eq, isNull } from 'drizzle-orm';
import { db } from '@/db/client';
import { auditLog, calculation, importBatch, material, materialTag, method, source } from '@/db/schema';
import { createApiToken } from '@/app/(app)/w/[workspace]/settings/tokens/actions';
import * as importsRoute from '@/app/api/v1/imports/route';
import { importCsvFile, importFile } from '@/lib/services/imports/csv-import';
import type { CatalogImportOutcome } from '@/lib/services/imports/catalog-import';
import { undoImport } from '@/lib/services/imports/undo';
import { retractMethod } from '@/lib/services/catalog/changes';
import { isImportRefusal, type ImportRefusalError } from '@/lib/import/errors';
import { AppError } from '@/lib/errors';
import type { TableKind } from '@/lib/import/columns';
import type { WorkspaceRole } from '@/lib/permissions';
import { callAction } from '../support/actions';
import { createWorkspaceWith, signInAs } from '../support/users';
import { bytesOf, chunksOf, seedCatalogue } from './import-fixtures';

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
const BASE = 'http://localhost:3999/api/v1';

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let other: Awaited<ReturnType<typeof createWorkspaceWith>>;
let cat: Awaited<ReturnType<typeof seedCatalogue>>;
const tokens: Record<string, string> = {};

async function makeToken(email: string, workspaceId: string, role: string): Promise<string> {
  await signInAs(email);
  const out = await callAction(createApiToken, { workspaceId, name: `${role} pipeline`, role });
  expect(out.state?.ok, out.state?.message).toBe(true);
  return (out.state as unknown as { data: { token: string } }).data.token;
}

function call(path: string, init: RequestInit & { token?: string } = {}) {
  const headers = new Headers(init.headers);
  if (init.token) headers.set('authorization', `Bearer ${init.token}`);
  return (importsRoute.POST as unknown as Handler)(new Request(`${BASE}${path}`, { method: 'POST', ...init, headers, duplex: 'half' } as RequestInit), { params: Promise.resolve({}) });
}

let fileNumber = 0;
function importText(text: string, kind: TableKind, extra: { workspaceId?: string; role?: WorkspaceRole; onChange?: 'refuse' | 'update'; prefer?: 'typed' | 'structure'; createMissing?: boolean; userId?: string } = {}) {
  return importFile({
    workspaceId: extra.workspaceId ?? ws.workspaceId,
    actor: { userId: extra.userId ?? ws.owner.id, tokenId: null },
    role: extra.role ?? 'owner',
    via: 'wizard',
    kind,
    fileName: `file-${++fileNumber}.csv`,
    body: chunksOf(bytesOf(text), 13),
    onChange: extra.onChange,
    prefer: extra.prefer,
    createMissing: extra.createMissing,
  });
}

async function refusal(p: Promise<unknown>): Promise<ImportRefusalError> {
  const e = await p.then(
    () => null,
    (err: unknown) => err,
  );
  expect(isImportRefusal(e), `expected a refusal, got ${String(e)}`).toBe(true);
  return e as ImportRefusalError;
}

async function failure(p: Promise<unknown>): Promise<AppError> {
  const e = await p.then(
    () => null,
    (err: unknown) => err,
  );
  expect(e).toBeInstanceOf(AppError);
  return e as AppError;
}

const liveMaterials = async (workspaceId = ws.workspaceId) =>
  (await db.select({ n: count() }).from(material).where(and(eq(material.workspaceId, workspaceId), isNull(material.retractedAt))))[0].n;
const importCount = async (workspaceId = ws.workspaceId) => (await db.select({ n: count() }).from(importBatch).where(eq(importBatch.workspaceId, workspaceId)))[0].n;

const MATERIALS = [
  'name,formula,display_name,space_group,atoms_in_cell,external_id,tags',
  'ZnO-wz,ZnO,ZnO (wurtzite),186,4,ext-zno-1,"oxide, semiconductor"',
  'MgO-rs,MgO,MgO (rocksalt),225,2,ext-mgo-1,oxide',
  'SrTiO3-cub,SrTiO3,SrTiO3 (cubic perovskite),221,5,,"oxide, perovskite"',
].join('\n');

beforeAll(async () => {
  ws = await createWorkspaceWith(['curator', 'contributor', 'reviewer']);
  other = await createWorkspaceWith();
  cat = await seedCatalogue(ws.workspaceId);
  await seedCatalogue(other.workspaceId);
  tokens.contributor = await makeToken(ws.members.contributor.email, ws.workspaceId, 'contributor');
  tokens.curator = await makeToken(ws.members.curator.email, ws.workspaceId, 'curator');
  tokens.reviewer = await makeToken(ws.members.curator.email, ws.workspaceId, 'reviewer');
});

describe('materials import', () => {
  let firstImportId: string;

  it('creates every row with derived fields, tags and the import id, audited once', async () => {
    const before = await liveMaterials();
    const out = (await importText(MATERIALS, 'materials')) as CatalogImportOutcome;
    expect(out).toMatchObject({ kind: 'materials', rowCount: 3, createdCount: 3, updatedCount: 0, unchangedCount: 0 });
    firstImportId = out.importId!;
    expect(await liveMaterials()).toBe(before + 3);
    const [zno] = await db.select().from(material).where(and(eq(material.workspaceId, ws.workspaceId), eq(material.name, 'ZnO-wz')));
    expect(zno).toMatchObject({ reducedFormula: 'ZnO', atomsPerFormulaUnit: 2, crystalSystem: 'hexagonal', atomsInCell: 4, externalId: 'ext-zno-1', displayName: 'ZnO (wurtzite)', importId: firstImportId });
    const tags = await db.select({ tag: materialTag.tag }).from(materialTag).where(eq(materialTag.materialId, zno.id));
    expect(tags.map((t) => t.tag).sort()).toEqual(['oxide', 'semiconductor']);
    const [batch] = await db.select().from(importBatch).where(eq(importBatch.id, firstImportId));
    expect(batch).toMatchObject({ kind: 'materials', rowCount: 3, insertedCount: 3, status: 'committed' });
    const audit = await db.select().from(auditLog).where(and(eq(auditLog.entityType, 'import'), eq(auditLog.entityId, firstImportId)));
    expect(audit).toHaveLength(1);
    expect(audit[0].after).toMatchObject({ kind: 'materials', createdCount: 3, updatedCount: 0 });
  });

  it('re-importing the same catalogue writes nothing and lists every row as unchanged', async () => {
    const imports = await importCount();
    const out = (await importText(MATERIALS, 'materials')) as CatalogImportOutcome;
    expect(out.importId).toBeNull();
    expect(out).toMatchObject({ createdCount: 0, updatedCount: 0, unchangedCount: 3 });
    expect(out.unchanged.map((u) => u.handle)).toEqual(['ZnO-wz', 'MgO-rs', 'SrTiO3-cub']);
    expect(await importCount()).toBe(imports);
  });

  it('matches by external identifier first, else by formula + space group + name; a row without the optional columns is unchanged', async () => {
    // ZnO-wz found by its external id although the file calls it otherwise → a rename, a change
    const renamed = await refusal(importText('name,formula,external_id\nZnO-w,ZnO,ext-zno-1', 'materials'));
    expect(renamed.errors).toEqual([expect.objectContaining({ row: 2, column: 'name', reason: expect.stringContaining('stored ZnO-wz, this file ZnO-w') })]);
    const out = (await importText('name,formula,space_group\nSrTiO3-cub,SrTiO3,221', 'materials')) as CatalogImportOutcome;
    expect(out).toMatchObject({ importId: null, unchangedCount: 1 });
  });

  it('refuses a changed row by default with row, column, stored and new value, and writes nothing', async () => {
    const imports = await importCount();
    const e = await refusal(importText('name,formula,space_group,atoms_in_cell,tags\nMgO-rs,MgO,225,4,"oxide, insulator"', 'materials'));
    expect(e.errors).toEqual([
      expect.objectContaining({ row: 2, column: 'atoms_in_cell', reason: expect.stringContaining('stored 2, this file 4'), value: '4' }),
      expect.objectContaining({ row: 2, column: 'tags', reason: expect.stringContaining('stored oxide, this file insulator, oxide') }),
    ]);
    expect(await importCount()).toBe(imports);
    const [mgo] = await db.select().from(material).where(and(eq(material.workspaceId, ws.workspaceId), eq(material.name, 'MgO-rs')));
    expect(mgo.atomsInCell).toBe(2);
  });

  it('a different material under a taken name is refused (identity includes the formula and space group)', async () => {
    const e = await refusal(importText('name,formula,space_group\nMgO-rs,MgO,216', 'materials'));
    expect(e.errors[0]).toMatchObject({ row: 2, column: 'name', reason: expect.stringContaining('is already the material with formula MgO, space group 225') });
  });

  it('onChange=update needs a curator or owner; then it updates with an audit entry holding before and after, and undo restores it', async () => {
    const text = 'name,formula,space_group,atoms_in_cell,tags\nMgO-rs,MgO,225,4,"oxide, insulator"';
    const denied = await failure(importText(text, 'materials', { role: 'contributor', onChange: 'update' }));
    expect(denied.code).toBe('forbidden');
    const out = (await importText(text, 'materials', { role: 'curator', onChange: 'update', userId: ws.members.curator.id })) as CatalogImportOutcome;
    expect(out).toMatchObject({ createdCount: 0, updatedCount: 1 });
    const [mgo] = await db.select().from(material).where(and(eq(material.workspaceId, ws.workspaceId), eq(material.name, 'MgO-rs')));
    expect(mgo.atomsInCell).toBe(4);
    const [entry] = await db.select().from(auditLog).where(and(eq(auditLog.entityId, mgo.id), eq(auditLog.action, 'import-update')));
    expect(entry.before).toMatchObject({ atomsInCell: 2, tags: ['oxide'] });
    expect(entry.after).toMatchObject({ atomsInCell: 4, tags: ['insulator', 'oxide'].sort(), importId: out.importId });

    const undone = await undoImport(ws.workspaceId, out.importId!, ws.owner.id, 'wrong cell');
    expect(undone.restoredRecords).toBe(1);
    const [restored] = await db.select().from(material).where(eq(material.id, mgo.id));
    expect(restored.atomsInCell).toBe(2);
    const tags = await db.select({ tag: materialTag.tag }).from(materialTag).where(eq(materialTag.materialId, mgo.id));
    expect(tags.map((t) => t.tag)).toEqual(['oxide']);
  });

  it('each bad-input class gets row, column and reason, and nothing is written', async () => {
    const before = await liveMaterials();
    const imports = await importCount();
    const text = [
      'name,formula,space_group,atoms_in_cell,external_id',
      'bad-formula,Xq2O,225,,',
      'bad-sg,NaCl,231,,',
      'bad-atoms,GaN,186,3,',
      'dup-a,AlN,186,4,ext-dup',
      'dup-a,AlN,186,4,',
      'dup-b,InN,186,4,ext-dup',
    ].join('\n');
    const e = await refusal(importText(text, 'materials'));
    const at = (row: number) => e.errors.filter((x) => x.row === row);
    expect(at(2)).toEqual([expect.objectContaining({ column: 'formula', reason: expect.stringMatching(/Xq/) })]);
    expect(at(3)).toEqual([expect.objectContaining({ column: 'space_group', reason: 'The space group must be between 1 and 230.' })]);
    expect(at(4)).toEqual([expect.objectContaining({ column: 'atoms_in_cell', reason: expect.stringContaining('3 atoms contradict the formula GaN') })]);
    expect(at(6)).toEqual([expect.objectContaining({ column: 'name', reason: expect.stringContaining('Duplicate name "dup-a": row 5') })]);
    expect(at(7)).toEqual([expect.objectContaining({ column: 'external_id', reason: expect.stringContaining('Duplicate external identifier "ext-dup": row 5') })]);
    expect(await liveMaterials()).toBe(before);
    expect(await importCount()).toBe(imports);

    const unknown = await refusal(importText('name,formula,colour\nX1,NaCl,blue', 'materials'));
    expect(unknown.errors).toEqual([expect.objectContaining({ row: 1, column: 'colour', reason: expect.stringContaining('not a column of materials') })]);
  });

  it('keeps workspaces apart: the same file creates fresh records in another workspace and never matches this one', async () => {
    const out = (await importText(MATERIALS, 'materials', { workspaceId: other.workspaceId, userId: other.owner.id })) as CatalogImportOutcome;
    expect(out.createdCount).toBe(3);
    const names = await db.select({ ws: material.workspaceId }).from(material).where(eq(material.name, 'ZnO-wz'));
    expect(new Set(names.map((n) => n.ws))).toEqual(new Set([ws.workspaceId, other.workspaceId]));
  });

  it('undo retracts the created materials unless other data refer to them, naming what does', async () => {
    const out = (await importText('name,formula,space_group,atoms_in_cell\nCdS-wz,CdS,186,4\nCdSe-wz,CdSe,186,4', 'materials')) as CatalogImportOutcome;
    const [cds] = await db.select().from(material).where(and(eq(material.workspaceId, ws.workspaceId), eq(material.name, 'CdS-wz')));
    const calc = await importCsvFile({
      workspaceId: ws.workspaceId,
      actor: { userId: ws.owner.id, tokenId: null },
      via: 'wizard',
      kind: 'calculations',
      fileName: 'cds.csv',
      body: chunksOf(bytesOf('material,method,quantity,value,unit,source\nCdS-wz,PBEsol-PAW-600,frequency,301,cm-1,inhouse-2026')),
    });
    const refused = await failure(undoImport(ws.workspaceId, out.importId!, ws.owner.id, 'try'));
    expect(refused.code).toBe('conflict');
    expect(refused.message).toContain('Material "CdS-wz" is used by 1 calculation(s)');
    expect((await db.select().from(material).where(eq(material.id, cds.id)))[0].retractedAt).toBeNull();

    await undoImport(ws.workspaceId, calc.importId, ws.owner.id, 'clear the way');
    const undone = await undoImport(ws.workspaceId, out.importId!, ws.owner.id, 'not needed');
    expect(undone.retractedRecords).toBe(2);
    const rows = await db.select().from(material).where(eq(material.importId, out.importId!));
    expect(rows.every((r) => r.retractedAt !== null && r.retractionReason === 'Import undone: not needed')).toBe(true);
  });
});

describe('methods import', () => {
  const METHODS = ['label,functional,pseudopotential,cutoff_eV,k_grid,q_grid,approach,lo_to_correction', 'PBE-PAW-520,PBE,PAW PBE 54,520,8x8x8,4x4x4,perturbation,yes', 'LDA-NC-80,LDA,NC,1088,6x6x6,,finite-displacement,no'].join('\n');

  it('creates every recipe field, and a re-import is unchanged', async () => {
    const out = (await importText(METHODS, 'methods')) as CatalogImportOutcome;
    expect(out.createdCount).toBe(2);
    const [pbe] = await db.select().from(method).where(and(eq(method.workspaceId, ws.workspaceId), eq(method.label, 'PBE-PAW-520')));
    expect(pbe).toMatchObject({ functional: 'PBE', pseudopotential: 'PAW PBE 54', cutoffEv: 520, kGrid: [8, 8, 8], qGrid: [4, 4, 4], approach: 'perturbation', nonAnalyticCorrection: true });
    const again = (await importText(METHODS, 'methods')) as CatalogImportOutcome;
    expect(again).toMatchObject({ importId: null, unchangedCount: 2 });
  });

  it('wrong-typed recipe fields get row, column and reason', async () => {
    const e = await refusal(importText('label,functional,cutoff_eV,k_grid,approach,lo_to_correction\nX-1,PBE,abc,8x8,dft,maybe', 'methods'));
    const columns = e.errors.map((x) => [x.row, x.column]);
    expect(columns).toEqual(expect.arrayContaining([[2, 'cutoff_eV'], [2, 'k_grid'], [2, 'approach'], [2, 'lo_to_correction']]));
    expect(e.errors.find((x) => x.column === 'cutoff_eV')?.reason).toBe('The cutoff must be a number.');
    expect(e.errors.find((x) => x.column === 'k_grid')?.reason).toContain('three positive whole numbers');
  });

  it('a changed recipe is refused with the stored and the new value', async () => {
    const e = await refusal(importText('label,functional,cutoff_eV\nPBE-PAW-520,PBE,600', 'methods'));
    expect(e.errors).toEqual([expect.objectContaining({ row: 2, column: 'cutoff_eV', reason: expect.stringContaining('stored 520, this file 600') })]);
  });

  it('after an undo, the corrected file restores the methods with its values (labels stay reserved); a method retracted by hand is still refused', async () => {
    const first = (await importText('label,functional,cutoff_eV\nSCAN-R1,SCAN,700\nSCAN-R2,SCAN,800', 'methods')) as CatalogImportOutcome;
    await undoImport(ws.workspaceId, first.importId!, ws.owner.id, 'cutoffs typed wrong');
    const fixed = (await importText('label,functional,cutoff_eV\nSCAN-R1,SCAN,750\nSCAN-R2,SCAN,850', 'methods')) as CatalogImportOutcome;
    expect(fixed).toMatchObject({ createdCount: 2, updatedCount: 0 });
    const rows = await db.select().from(method).where(and(eq(method.workspaceId, ws.workspaceId), eq(method.functional, 'SCAN')));
    expect(rows.map((m) => [m.label, m.cutoffEv, m.retractedAt, m.importId]).sort()).toEqual([
      ['SCAN-R1', 750, null, fixed.importId],
      ['SCAN-R2', 850, null, fixed.importId],
    ]);
    const restored = await db.select().from(auditLog).where(and(eq(auditLog.action, 'import-restore'), eq(auditLog.entityId, rows[0].id)));
    expect(restored).toHaveLength(1);
    // The new import owns them: its undo retracts them again.
    await undoImport(ws.workspaceId, fixed.importId!, ws.owner.id, 'not this run');
    expect((await db.select().from(method).where(and(eq(method.workspaceId, ws.workspaceId), eq(method.functional, 'SCAN'), isNull(method.retractedAt))))).toHaveLength(0);
    // A curator's own retraction is not undone by an import.
    const [lda] = await db.select().from(method).where(and(eq(method.workspaceId, ws.workspaceId), eq(method.label, 'LDA-NC-80')));
    await retractMethod(ws.workspaceId, { userId: ws.owner.id }, lda.id, 'recipe withdrawn');
    const e = await refusal(importText('label,functional\nLDA-NC-80,LDA', 'methods'));
    expect(e.errors).toEqual([expect.objectContaining({ row: 2, column: 'label', reason: expect.stringContaining('restore it first') })]);
  });
});

describe('sources import', () => {
  it('rows with DOI, title, authors, year and venue; an identical re-import is unchanged; a DOI of another source is refused', async () => {
    const text = 'cite_key,doi,title,authors,year,venue\nparker1967b,10.1103/PhysRev.155.712,Raman scattering by silicon and germanium,"Parker, J. H.; Feldman, D. W.; Ashkin, M.",1967,Physical Review';
    const out = (await importText(text, 'sources')) as CatalogImportOutcome;
    expect(out.createdCount).toBe(1);
    const [s] = await db.select().from(source).where(and(eq(source.workspaceId, ws.workspaceId), eq(source.citeKey, 'parker1967b')));
    expect(s).toMatchObject({ doi: '10.1103/physrev.155.712', year: 1967, venue: 'Physical Review', importId: out.importId });
    expect(s.authorList?.[0]).toMatchObject({ family: 'Parker' });
    expect(((await importText(text, 'sources')) as CatalogImportOutcome).unchangedCount).toBe(1);
    const e = await refusal(importText('cite_key,doi,title\nother1967,10.1103/physrev.155.712,Same paper', 'sources'));
    expect(e.errors[0]).toMatchObject({ row: 2, column: 'doi', reason: expect.stringContaining('already the source "parker1967b"') });
  });

  it('a BibTeX file through the same path', async () => {
    const bib = '@article{ashkin1970,\n  author = {Ashkin, M. and Parker, J. H.},\n  title = {A made-up test entry},\n  journal = {Test Journal},\n  year = {1970}\n}\n';
    const out = (await importText(bib, 'sources')) as CatalogImportOutcome;
    expect(out).toMatchObject({ createdCount: 1 });
    expect(((await importText(bib, 'sources')) as CatalogImportOutcome).unchangedCount).toBe(1);
  });
});

describe('API: POST /api/v1/imports?kind=materials|methods|sources and JSON {kind, rows}', () => {
  it('a contributor token imports a materials CSV (201) and JSON rows; an all-unchanged import answers 200 without an import', async () => {
    const csv = 'name,formula,space_group,atoms_in_cell\nAlN-wz,AlN,186,4';
    const res = await call('/imports?kind=materials&fileName=aln.csv', { token: tokens.contributor, headers: { 'content-type': 'text/csv' }, body: csv });
    expect(res.status, await res.clone().text()).toBe(201);
    expect(await res.json()).toMatchObject({ kind: 'materials', createdCount: 1 });
    const json = await call('/imports', { token: tokens.contributor, headers: { 'content-type': 'application/json' }, body: JSON.stringify({ kind: 'materials', rows: [{ name: 'AlN-wz', formula: 'AlN', space_group: '186', atoms_in_cell: 4 }, { name: 'BN-h', formula: 'BN', space_group: 194, atoms_in_cell: 4 }] }) });
    expect(json.status).toBe(201);
    expect(await json.json()).toMatchObject({ createdCount: 1, unchangedCount: 1 });
    const same = await call('/imports?kind=materials', { token: tokens.contributor, headers: { 'content-type': 'text/csv' }, body: csv });
    expect(same.status).toBe(200);
    expect(await same.json()).toMatchObject({ importId: null, unchangedCount: 1 });
  });

  it('refuses tokens lacking the permission: reviewer (403), contributor asking onChange=update (403); a curator may', async () => {
    const csv = 'name,formula,space_group,atoms_in_cell\nAlN-wz,AlN,186,8';
    for (const [token, path] of [
      [tokens.reviewer, '/imports?kind=materials'],
      [tokens.contributor, '/imports?kind=materials&onChange=update'],
      [tokens.reviewer, '/imports?kind=calculations&createMissing=true'],
    ]) {
      const res = await call(path, { token, headers: { 'content-type': 'text/csv' }, body: csv });
      expect(res.status, path).toBe(403);
      expect(res.headers.get('content-type')).toContain('application/problem+json');
    }
    const refused = await call('/imports?kind=materials', { token: tokens.curator, headers: { 'content-type': 'text/csv' }, body: csv });
    expect(refused.status).toBe(422);
    expect((await refused.json()).errors[0]).toMatchObject({ row: 2, column: 'atoms_in_cell' });
    const ok = await call('/imports?kind=materials&onChange=update', { token: tokens.curator, headers: { 'content-type': 'text/csv' }, body: csv });
    expect(ok.status).toBe(201);
    expect(await ok.json()).toMatchObject({ updatedCount: 1 });
  });

  it('methods and sources as JSON rows; BibTeX as application/x-bibtex', async () => {
    const m = await call('/imports', { token: tokens.contributor, headers: { 'content-type': 'application/json' }, body: JSON.stringify({ kind: 'methods', rows: [{ label: 'r2SCAN-PAW', functional: 'r2SCAN', cutoff_eV: '700' }] }) });
    expect(m.status).toBe(201);
    const bad = await call('/imports', { token: tokens.contributor, headers: { 'content-type': 'application/json' }, body: JSON.stringify({ kind: 'methods', rows: [{ label: 'bad', functional: 'PBE', cutoff_eV: 'lots' }] }) });
    expect(bad.status).toBe(422);
    expect((await bad.json()).errors).toEqual([expect.objectContaining({ row: 1, column: 'cutoff_eV' })]);
    const bib = await call('/imports?kind=sources', { token: tokens.contributor, headers: { 'content-type': 'application/x-bibtex' }, body: '@article{feldman1968,\n  author = {Feldman, D. W.},\n  title = {Another made-up entry},\n  year = {1968}\n}\n' });
    expect(bib.status, await bib.clone().text()).toBe(201);
  });
});

describe('calculations with createMissing', () => {
  const HEADER = 'material,method,quantity,value,unit,mode_index,source,material_formula,material_space_group,material_atoms_in_cell,method_functional,method_k_grid';
  const rows = (name: string, label: string, atoms = '2') => [
    `${name},${label},frequency,0.01,cm-1,1,inhouse-2026,NaCl,225,${atoms},PBE,8x8x8`,
    `${name},${label},frequency,164,cm-1,4,inhouse-2026,NaCl,225,2,PBE,8x8x8`,
  ];

  it('without the flag unknown references are refused as before', async () => {
    const e = await refusal(importText([HEADER, ...rows('NaCl-new', 'PBE-new')].join('\n'), 'calculations'));
    expect(e.errors).toEqual(expect.arrayContaining([expect.objectContaining({ row: 2, column: 'material', reason: 'Unknown material "NaCl-new".' }), expect.objectContaining({ row: 2, column: 'method', reason: 'Unknown method "PBE-new".' })]));
    expect((await db.select().from(material).where(eq(material.name, 'NaCl-new'))).length).toBe(0);
  });

  it('with the flag it creates the material and method in the same transaction; undo removes them', async () => {
    const out = await importText([HEADER, ...rows('NaCl-new', 'PBE-new')].join('\n'), 'calculations', { createMissing: true });
    expect(out).toMatchObject({ insertedCount: 2, createdMaterials: 1, createdMethods: 1 });
    const [nacl] = await db.select().from(material).where(and(eq(material.workspaceId, ws.workspaceId), eq(material.name, 'NaCl-new')));
    expect(nacl).toMatchObject({ reducedFormula: 'NaCl', spaceGroup: 225, atomsInCell: 2, importId: out.importId });
    const [pbe] = await db.select().from(method).where(and(eq(method.workspaceId, ws.workspaceId), eq(method.label, 'PBE-new')));
    expect(pbe).toMatchObject({ functional: 'PBE', kGrid: [8, 8, 8], importId: out.importId });
    const values = await db.select().from(calculation).where(eq(calculation.importId, out.importId!));
    expect(values.every((v) => v.materialId === nacl.id && v.methodId === pbe.id)).toBe(true);

    const undone = await undoImport(ws.workspaceId, out.importId!, ws.owner.id, 'rerun');
    expect(undone).toMatchObject({ retracted: 2, retractedRecords: 2 });
    expect((await db.select().from(material).where(eq(material.id, nacl.id)))[0].retractedAt).not.toBeNull();
    expect((await db.select().from(method).where(eq(method.id, pbe.id)))[0].retractedAt).not.toBeNull();
  });

  it('conflicting catalogue columns for one new material across rows are row errors; nothing is written', async () => {
    const before = await liveMaterials();
    const e = await refusal(importText([HEADER, ...rows('KCl-new', 'PBE-kcl', '4')].join('\n').replace(/NaCl,225/g, 'KCl,225'), 'calculations', { createMissing: true }));
    expect(e.errors).toEqual([expect.objectContaining({ row: 3, column: 'material_atoms_in_cell', reason: expect.stringContaining('Conflicts with row 2') })]);
    const bad = await refusal(importText([HEADER, 'X-new,PBE-x,frequency,100,cm-1,4,inhouse-2026,NaCl,225,3,PBE,8x8'].join('\n'), 'calculations', { createMissing: true }));
    expect(bad.errors).toEqual(expect.arrayContaining([expect.objectContaining({ row: 2, column: 'material_atoms_in_cell' }), expect.objectContaining({ row: 2, column: 'method_k_grid' })]));
    expect(await liveMaterials()).toBe(before);
    expect((await db.select().from(method).where(eq(method.label, 'PBE-kcl'))).length).toBe(0);
  });

  it('rows naming stored records still use them (no catalogue columns needed)', async () => {
    const out = await importText(`${HEADER}\nGaN-wz,PBEsol-PAW-600,frequency,530,cm-1,7,inhouse-2026,,,,,`, 'calculations', { createMissing: true });
    expect(out).toMatchObject({ insertedCount: 1, createdMaterials: 0, createdMethods: 0 });
    const [row] = await db.select().from(calculation).where(eq(calculation.importId, out.importId!));
    expect(row.materialId).toBe(cat.gan.id);
  });
});

describe('materials with a structure column (POSCAR or CIF text)', () => {
  // data/structures/: invented demo cells with textbook lattice parameters (see its README).
  const quoted = (text: string) => `"${text.replace(/"/g, '""')}"`;
  const gan = readFileSync('data/structures/GaN-wurtzite.POSCAR', 'utf8');
  const nacl = readFileSync('data/structures/NaCl-rocksalt.cif', 'utf8');
  const HEAD = 'name,formula,space_group,atoms_in_cell,structure,prefer';

  it('derives formula, atoms in the primitive cell and space group into empty cells (POSCAR and CIF)', async () => {
    const out = (await importText(`${HEAD}\nS-GaN,,,,${quoted(gan)},\nS-NaCl,,,,${quoted(nacl)},`, 'materials')) as CatalogImportOutcome;
    expect(out.createdCount).toBe(2);
    const rows = await db.select().from(material).where(and(eq(material.workspaceId, ws.workspaceId), eq(material.importId, out.importId!)));
    const byName = new Map(rows.map((r) => [r.name, r]));
    expect(byName.get('S-GaN')).toMatchObject({ reducedFormula: 'GaN', spaceGroup: 186, atomsInCell: 4 });
    expect(byName.get('S-NaCl')).toMatchObject({ reducedFormula: 'NaCl', spaceGroup: 225, atomsInCell: 2 });
  });

  it('refuses a row whose typed values disagree with its structure, showing both, until one is chosen', async () => {
    const text = `${HEAD}\nS2-GaN,GaN,225,4,${quoted(gan)},`;
    const e = await refusal(importText(text, 'materials'));
    expect(e.errors).toEqual([expect.objectContaining({ row: 2, column: 'space_group', reason: expect.stringContaining('Typed 225, the structure (poscar) gives space group 186') })]);
    const typed = (await importText(text, 'materials', { prefer: 'typed' })) as CatalogImportOutcome;
    const [kept] = await db.select().from(material).where(eq(material.importId, typed.importId!));
    expect(kept.spaceGroup).toBe(225);
    const perRow = (await importText(`${HEAD}\nS3-GaN,GaN,225,4,${quoted(gan)},structure`, 'materials', { prefer: 'typed' })) as CatalogImportOutcome;
    const [taken] = await db.select().from(material).where(eq(material.importId, perRow.importId!));
    expect(taken.spaceGroup).toBe(186);
  });

  it('a structure that does not parse is a row error with the reason; nothing is written', async () => {
    const before = await liveMaterials();
    const e = await refusal(importText(`${HEAD}\nS-bad,,,,${quoted('not a structure\n1.0\n')},`, 'materials'));
    expect(e.errors).toEqual([expect.objectContaining({ row: 2, column: 'structure', reason: expect.stringContaining('The structure cannot be read') })]);
    expect(await liveMaterials()).toBe(before);
  });
});
