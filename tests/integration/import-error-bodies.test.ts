import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { importBatch, measurement } from '@/db/schema';
import * as v1ImportsRoute from '@/app/api/v1/imports/route';
import { createApiToken } from '@/app/(app)/w/[workspace]/settings/tokens/actions';
import { importCsvFile } from '@/lib/services/imports/csv-import';
import { MAX_CELL_CHARS, MAX_REPORTED_ERRORS, isImportRefusal, type ImportRefusalError } from '@/lib/import/errors';
import { callAction } from '../support/actions';
import { createWorkspaceWith, signInAs } from '../support/users';
import { bytesOf, chunksOf, seedCatalogue } from './import-fixtures';

// Issue 11, item 4: a refused import must not amplify the upload (cell limit, short echoes, a capped list).

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let token: string;

beforeAll(async () => {
  ws = await createWorkspaceWith();
  await seedCatalogue(ws.workspaceId);
  await signInAs(ws.owner.email);
  const out = await callAction(createApiToken, { workspaceId: ws.workspaceId, name: 'bulk', role: 'contributor' });
  token = (out.state as unknown as { data: { token: string } }).data.token;
});

const H = 'material,quantity,value,unit,temperature_K,source,notes';

async function refusalOf(text: string, chunk = 64 * 1024): Promise<ImportRefusalError> {
  const before = await db.$count(measurement, eq(measurement.workspaceId, ws.workspaceId));
  const e = await importCsvFile({
    workspaceId: ws.workspaceId,
    actor: { userId: ws.owner.id, tokenId: null },
    via: 'wizard',
    kind: 'measurements',
    fileName: 'long.csv',
    body: chunksOf(bytesOf(text), chunk),
  }).catch((err: unknown) => err);
  expect(isImportRefusal(e)).toBe(true);
  expect(await db.$count(measurement, eq(measurement.workspaceId, ws.workspaceId))).toBe(before);
  return e as ImportRefusalError;
}

function postCsv(body: string): Promise<Response> {
  const headers = new Headers({ authorization: `Bearer ${token}`, 'content-type': 'text/csv' });
  return (v1ImportsRoute.POST as Handler)(
    new Request('http://localhost:3999/api/v1/imports?kind=measurements&fileName=amplify.csv', { method: 'POST', headers, body, duplex: 'half' } as RequestInit),
    { params: Promise.resolve({}) },
  );
}

describe('cell length limit', () => {
  it(`refuses a cell over ${MAX_CELL_CHARS} characters with its row and column`, async () => {
    const long = 'n'.repeat(MAX_CELL_CHARS + 1);
    const e = await refusalOf(`${H}\nSi,frequency,520,cm-1,300,azuhata1995,ok\nSi,frequency,521,cm-1,300,azuhata1995,${long}\n`);
    expect(e.errors).toEqual([{ row: 3, column: 'notes', reason: 'This cell has 10,001 characters; a cell may have at most 10,000.' }]);
    // Exactly at the limit is fine as far as length goes (this row fails only on its unknown material).
    const atLimit = await refusalOf(`${H}\nXx,frequency,520,cm-1,300,azuhata1995,${'n'.repeat(MAX_CELL_CHARS)}\n`);
    expect(atLimit.errors.map((x) => x.column)).toEqual(['material']);
  });

  it('stops reading a 2 MB cell at the limit, naming row and column, instead of buffering it', async () => {
    const e = await refusalOf(`${H}\nSi,frequency,520,cm-1,300,azuhata1995,ok\nSi,frequency,521,cm-1,300,${'s'.repeat(2 * 1024 * 1024)},x\n`);
    expect(e.errors).toHaveLength(1);
    expect(e.errors[0]).toMatchObject({ row: 3, column: 'source', reason: expect.stringMatching(/longer than 10,000 characters/) });
  });

  it('refuses an overlong header cell and a JSON cell over the limit', async () => {
    const header = await refusalOf(`material,quantity,value,unit,source,${'h'.repeat(MAX_CELL_CHARS + 5)}\nSi,frequency,520,cm-1,azuhata1995,x\n`);
    expect(header.errors).toEqual([{ row: 1, column: 'column 6', reason: 'This cell has 10,005 characters; a cell may have at most 10,000.' }]);

    const headers = new Headers({ authorization: `Bearer ${token}`, 'content-type': 'application/json' });
    const rows = [{ material: 'Si', quantity: 'frequency', value: '520', unit: 'cm-1', source: 'azuhata1995', notes: 'x'.repeat(MAX_CELL_CHARS + 1) }];
    const res = await (v1ImportsRoute.POST as Handler)(
      new Request('http://localhost:3999/api/v1/imports', { method: 'POST', headers, body: JSON.stringify({ kind: 'measurements', rows }) }),
      { params: Promise.resolve({}) },
    );
    expect(res.status).toBe(422);
    expect((await res.json()).errors).toEqual([{ row: 1, column: 'notes', reason: 'This cell has 10,001 characters; a cell may have at most 10,000.' }]);
  });
});

describe('NUL bytes in notes', () => {
  it('are refused with row and column, like every other text cell', async () => {
    const e = await refusalOf(`${H}\nSi,frequency,520,cm-1,300,azuhata1995,before\u0000after\n`);
    expect(e.errors).toEqual([{ row: 2, column: 'notes', reason: 'Notes contain a NUL byte (character 7); remove it.' }]);
  });
});

describe('the 422 body stays small whatever the file', () => {
  it('echoes at most 40 characters of a value and lists at most 1,000 errors, with the total count', async () => {
    // 1,500 rows, each with a 9,999-character unknown material and a bad value: 3,000 errors, about 15 MB of file.
    const material = 'M'.repeat(MAX_CELL_CHARS - 1);
    const unit = 'u'.repeat(MAX_CELL_CHARS - 1);
    const lines = [H];
    for (let i = 0; i < 1500; i++) lines.push(`${material},frequency,520,${unit},300,azuhata1995,`);
    const file = `${lines.join('\n')}\n`;
    const res = await postCsv(file);
    expect(res.status).toBe(422);
    const text = await res.text();
    const body = JSON.parse(text) as { errorCount: number; errors: Array<{ row: number; column: string; reason: string; value?: string }> };
    expect(body.errorCount).toBe(3000);
    expect(body.errors).toHaveLength(MAX_REPORTED_ERRORS);
    expect(body.errors[0]).toEqual({ row: 2, column: 'material', reason: `Unknown material "${'M'.repeat(40)}…".`, value: `${'M'.repeat(40)}…` });
    for (const e of body.errors) {
      expect(e.reason.length).toBeLessThan(200);
      expect((e.value ?? '').length).toBeLessThanOrEqual(41);
    }
    // 15 MB in, well under 1 MB out (the benchmark npm run bench:error-bodies checks files up to the upload limit).
    expect(file.length).toBeGreaterThan(15_000_000);
    expect(Buffer.byteLength(text)).toBeLessThan(250_000);
    expect(await db.$count(importBatch, eq(importBatch.workspaceId, ws.workspaceId))).toBe(0);
  });
});
