// A real HTTP server over the /api/v1 route handlers, for tests that drive the API with curl (the README's
// workflow script): each request is turned into a web Request and given to the route module of its path,
// as Next's router would (app/api/v1/**/route.ts, [param] segments). It runs in the test's own process and
// database, so the recomputation queue the routes report on is the one that computes.
import { createServer, type Server } from 'node:http';
import { readdirSync, statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import type { AddressInfo } from 'node:net';

type Handler = (request: Request, context: { params: Promise<Record<string, string>> }) => Promise<Response>;
interface RouteEntry {
  pattern: RegExp;
  names: string[];
  file: string;
  depth: number;
}

const ROOT = resolve(__dirname, '../../app/api/v1');

/** Every route file under app/api/v1 (also what the OpenAPI test compares with the document). */
export function apiRouteFiles(dir = ROOT): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const full = join(dir, name);
    if (statSync(full).isDirectory()) out.push(...apiRouteFiles(full));
    else if (name === 'route.ts') out.push(full);
  }
  return out;
}

/** The OpenAPI-style path of a route file: app/api/v1/benchmarks/[id]/route.ts → /benchmarks/{id}. */
export function openApiPathOf(file: string): string {
  const rel = relative(ROOT, file).split(/[\\/]/).slice(0, -1);
  return '/' + rel.map((s) => s.replace(/^\[(.+)\]$/, '{$1}')).join('/');
}

function entries(): RouteEntry[] {
  return apiRouteFiles()
    .map((file) => {
      const segments = openApiPathOf(file).split('/').filter(Boolean);
      const names: string[] = [];
      const source = segments.map((s) => {
        const m = /^\{(.+)\}$/.exec(s);
        if (!m) return s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
        names.push(m[1]);
        return '([^/]+)';
      });
      return { pattern: new RegExp(`^/api/v1/${source.join('/')}$`), names, file, depth: names.length };
    })
    .sort((a, b) => a.depth - b.depth); // literal segments before parameters
}

export async function startApiServer(): Promise<{ url: string; close: () => Promise<void> }> {
  const routes = entries();
  const server: Server = createServer(async (req, res) => {
    try {
      const url = new URL(req.url ?? '/', 'http://127.0.0.1');
      const route = routes.find((r) => r.pattern.test(url.pathname));
      const match = route ? route.pattern.exec(url.pathname)! : null;
      const mod = route ? ((await import(route.file)) as Record<string, Handler | undefined>) : null;
      const handler = mod?.[req.method ?? 'GET'];
      if (!route || !handler) {
        res.writeHead(404, { 'content-type': 'application/problem+json' }).end(JSON.stringify({ type: 'about:blank', title: 'not-found', status: 404, detail: 'No such route.' }));
        return;
      }
      const params = Object.fromEntries(route.names.map((n, i) => [n, decodeURIComponent(match![i + 1])]));
      const chunks: Buffer[] = [];
      for await (const chunk of req) chunks.push(chunk as Buffer);
      const headers = new Headers();
      for (const [k, v] of Object.entries(req.headers)) if (typeof v === 'string') headers.set(k, v);
      const body = chunks.length ? Buffer.concat(chunks) : undefined;
      const request = new Request(`http://127.0.0.1${req.url}`, { method: req.method, headers, body: req.method === 'GET' || req.method === 'HEAD' ? undefined : body });
      const response = await handler(request, { params: Promise.resolve(params) });
      const out: Record<string, string> = {};
      response.headers.forEach((v, k) => (out[k] = v));
      res.writeHead(response.status, out).end(Buffer.from(await response.arrayBuffer()));
    } catch (error) {
      console.error(error);
      res.writeHead(500).end();
    }
  });
  await new Promise<void>((done) => server.listen(0, '127.0.0.1', done));
  const { port } = server.address() as AddressInfo;
  return { url: `http://127.0.0.1:${port}`, close: () => new Promise<void>((done) => server.close(() => done())) };
}
