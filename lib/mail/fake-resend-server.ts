/**
 * A local stand-in for the Resend HTTP API, for development and tests.
 * It accepts the requests the Resend SDK sends (POST /emails with a bearer key
 * and an optional Idempotency-Key), stores the messages in memory, and lets
 * tests inject faults. The app's mailbox page reads GET /__mailbox.
 */
import { createHash, randomUUID } from 'node:crypto';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { fileURLToPath } from 'node:url';
import { envValue } from '@/lib/env';
import { readNodeBody } from '@/lib/read-node-body';

export type Fault = '500' | '429' | 'timeout' | 'store-then-drop';

export interface StoredMessage {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text?: string;
  html?: string;
  headers?: Record<string, string>;
  idempotencyKey?: string;
}

export interface FakeResend {
  url: string;
  messages: StoredMessage[];
  /** Requests to POST /emails, successful or not. */
  requestCount: () => number;
  setFaults: (faults: Fault[]) => void;
  clear: () => void;
  close: () => Promise<void>;
}

const readBody = (req: IncomingMessage) => readNodeBody(req, 5_000_000);

function json(res: ServerResponse, status: number, body: unknown) {
  res.writeHead(status, { 'content-type': 'application/json' });
  res.end(JSON.stringify(body));
}

function error(res: ServerResponse, statusCode: number, name: string, message: string) {
  json(res, statusCode, { statusCode, name, message });
}

export async function startFakeResend(port = 0, host = '127.0.0.1'): Promise<FakeResend> {
  const messages: StoredMessage[] = [];
  const byKey = new Map<string, { id: string; hash: string }>();
  let faults: Fault[] = [];
  let requests = 0;
  const hanging = new Set<ServerResponse>();

  const server: Server = createServer(async (req, res) => {
    try {
      const url = new URL(req.url ?? '/', 'http://fake');
      if (url.pathname === '/__mailbox' && req.method === 'GET') {
        return json(res, 200, { messages: [...messages].reverse() });
      }
      if (url.pathname === '/__mailbox' && req.method === 'DELETE') {
        messages.length = 0;
        byKey.clear();
        return json(res, 200, { cleared: true });
      }
      if (url.pathname === '/__faults' && req.method === 'POST') {
        const body = JSON.parse((await readBody(req)) || '{}') as { faults?: Fault[] };
        faults = [...(body.faults ?? [])];
        return json(res, 200, { faults });
      }
      if (url.pathname !== '/emails' || req.method !== 'POST') {
        return error(res, 404, 'not_found', 'The requested endpoint does not exist.');
      }
      requests++;
      const auth = req.headers.authorization ?? '';
      if (!/^Bearer \S+/.test(auth)) return error(res, 401, 'missing_api_key', 'Missing API key in the authorization header.');
      const raw = await readBody(req);
      let payload: Record<string, unknown>;
      try {
        payload = JSON.parse(raw) as Record<string, unknown>;
      } catch {
        return error(res, 422, 'validation_error', 'Body is not JSON.');
      }
      const to = typeof payload.to === 'string' ? [payload.to] : Array.isArray(payload.to) ? (payload.to as string[]) : [];
      if (typeof payload.from !== 'string' || !payload.from || to.length === 0 || typeof payload.subject !== 'string' || !payload.subject) {
        return error(res, 422, 'validation_error', 'from, to and subject are required.');
      }

      const fault = faults.shift();
      if (fault === '500') return error(res, 500, 'internal_server_error', 'Injected failure.');
      if (fault === '429') {
        res.setHeader('retry-after', '1');
        return error(res, 429, 'rate_limit_exceeded', 'Too many requests.');
      }
      if (fault === 'timeout') {
        hanging.add(res);
        req.socket.on('close', () => hanging.delete(res));
        return;
      }

      const key = req.headers['idempotency-key'];
      const idempotencyKey = typeof key === 'string' ? key : undefined;
      const hash = createHash('sha256').update(raw).digest('hex');
      if (idempotencyKey) {
        const seen = byKey.get(idempotencyKey);
        if (seen) {
          if (seen.hash !== hash) return error(res, 409, 'invalid_idempotent_request', 'Same idempotency key, different payload.');
          if (fault === 'store-then-drop') return req.socket.destroy();
          return json(res, 200, { id: seen.id });
        }
      }
      const id = randomUUID();
      messages.push({
        id,
        receivedAt: new Date().toISOString(),
        from: payload.from,
        to,
        subject: payload.subject,
        text: typeof payload.text === 'string' ? payload.text : undefined,
        html: typeof payload.html === 'string' ? payload.html : undefined,
        headers: (payload.headers as Record<string, string> | undefined) ?? undefined,
        idempotencyKey,
      });
      if (idempotencyKey) byKey.set(idempotencyKey, { id, hash });
      // Stored, but the sender never hears back: as if the connection died mid-send.
      if (fault === 'store-then-drop') return req.socket.destroy();
      return json(res, 200, { id });
    } catch (e) {
      return error(res, 500, 'internal_server_error', e instanceof Error ? e.message : String(e));
    }
  });

  await new Promise<void>((resolve) => server.listen(port, host, resolve));
  const address = server.address() as AddressInfo;
  return {
    url: `http://${host}:${address.port}`,
    messages,
    requestCount: () => requests,
    setFaults: (f) => {
      faults = [...f];
    },
    clear: () => {
      messages.length = 0;
      byKey.clear();
    },
    close: () =>
      new Promise<void>((resolve) => {
        for (const res of hanging) res.socket?.destroy();
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const port = envValue('FAKE_RESEND_PORT');
  startFakeResend(port).then((fake) => {
    console.log(`Fake Resend listening on ${fake.url} (mailbox: ${fake.url}/__mailbox)`);
  });
}
