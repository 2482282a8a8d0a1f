import { beforeAll, describe, expect, it } from 'vitest';
import { createApiToken } from '@/app/(app)/w/[workspace]/settings/tokens/actions';
import { createSourceAction } from '@/app/(app)/w/[workspace]/sources/actions';
import * as sourcesRoute from '@/app/api/v1/sources/route';
import * as sourceRoute from '@/app/api/v1/sources/[id]/route';
import * as openapiRoute from '@/app/api/v1/openapi.json/route';
import { callAction } from '../support/actions';
import { createWorkspaceWith, signInAs } from '../support/users';

type Action = Parameters<typeof callAction>[0];
const run = async (action: unknown, fields: Record<string, string>) => (await callAction(action as Action, fields)).state!;

const BASE = 'http://localhost:3999/api/v1';
let ws: Awaited<ReturnType<typeof createWorkspaceWith>>;
let token: string;
let id: string;

beforeAll(async () => {
  ws = await createWorkspaceWith(['contributor']);
  await signInAs(ws.members.contributor.email);
  // Azuhata et al., J. Phys.: Condens. Matter 7, L129 (1995) — shared/reference/check-values.md
  const created = await run(createSourceAction, { workspaceId: ws.workspaceId, kind: 'journal-article', citeKey: 'azuhata1995', title: 'Polarized Raman spectra in GaN', authors: 'Azuhata T.; Sota T.; Suzuki K.; Nakamura S.', year: '1995', venue: 'J. Phys.: Condens. Matter', volume: '7', issue: '10', pages: 'L129' });
  id = (created as unknown as { data: { id: string } }).data.id;
  const out = await callAction(createApiToken, { workspaceId: ws.workspaceId, name: 'reader', role: 'reviewer' });
  token = (out.state as unknown as { data: { token: string } }).data.token;
});

const call = (handler: unknown, path: string, params: Record<string, string> = {}) =>
  (handler as (r: Request, c: { params: Promise<Record<string, string>> }) => Promise<Response>)(new Request(`${BASE}${path}`, { headers: { authorization: `Bearer ${token}` } }), { params: Promise.resolve(params) });

describe('/api/v1/sources', () => {
  it('returns the structured fields, authors in the one display format, and the gaps', async () => {
    const one = await (await call(sourceRoute.GET, `/sources/${id}`, { id })).json();
    expect(one).toMatchObject({
      citeKey: 'azuhata1995',
      authors: 'T. Azuhata, T. Sota, K. Suzuki and S. Nakamura',
      authorList: [
        { family: 'Azuhata', given: 'T.' },
        { family: 'Sota', given: 'T.' },
        { family: 'Suzuki', given: 'K.' },
        { family: 'Nakamura', given: 'S.' },
      ],
      editorList: [],
      venue: 'J. Phys.: Condens. Matter',
      volume: '7',
      issue: '10',
      pages: 'L129',
      gaps: ['identifier'],
    });
    const page = await (await call(sourcesRoute.GET, '/sources')).json();
    expect(page.items[0]).toMatchObject({ citeKey: 'azuhata1995', authors: 'T. Azuhata, T. Sota, K. Suzuki and S. Nakamura', volume: '7', pages: 'L129', gaps: ['identifier'] });
  });

  it('documents them in the OpenAPI document', async () => {
    const doc = await (await openapiRoute.GET(new Request(`${BASE}/openapi.json`))).json();
    const props = doc.components.schemas.Source.properties;
    for (const field of ['authorList', 'editorList', 'volume', 'issue', 'pages', 'articleNumber', 'publisher', 'accessedOn', 'note', 'gaps']) expect(props, field).toHaveProperty(field);
    expect(JSON.stringify(props.authorList)).toContain('family');
  });
});
