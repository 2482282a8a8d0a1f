/**
 * A webhook receiver on loopback, for tests and for trying webhooks locally.
 * It does what the README asks of a real receiver: verifies the signature and
 * the timestamp, then processes each Ledger-Webhook-Id once (a repeat is
 * answered 200 and not processed again). Faults can be injected, one per
 * request, as the fake mail provider does.
 */
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { verifyWebhook, WEBHOOK_HEADERS } from './signature';
import { readNodeBody } from '@/lib/read-node-body';

/**
 * '500', '400', '429' (with Retry-After, 120 s unless set) and 'redirect' (307) answer without processing;
 * 'timeout' never answers; 'store-then-drop' processes, then drops the connection unanswered.
 */
export type ReceiverFault = '500' | '400' | '429' | 'redirect' | 'timeout' | 'store-then-drop';

export interface ReceivedEvent {
  id: string;
  body: string;
  host: string | undefined;
  attempt: string | undefined;
  processedAt: Date;
}

export interface FakeReceiver {
  url: string;
  port: number;
  /** Each event processed, once per id, in order. */
  processed: ReceivedEvent[];
  /** How many requests carried each id (signed correctly or not). */
  deliveriesOf: (id: string) => number;
  requestCount: () => number;
  /** Requests refused because the signature or timestamp did not verify. */
  refusedCount: () => number;
  setSecret: (secret: string) => void;
  setFaults: (faults: ReceiverFault[]) => void;
  /** Every answer waits this long first (a slow receiver). */
  setDelayMs: (ms: number) => void;
  clear: () => void;
  close: () => Promise<void>;
}

const readBody = (req: IncomingMessage) => readNodeBody(req, 1_000_000);

export async function startFakeReceiver(options: { secret?: string; host?: string; port?: number; retryAfter?: string } = {}): Promise<FakeReceiver> {
  const host = options.host ?? '127.0.0.1';
  let secret = options.secret ?? '';
  let faults: ReceiverFault[] = [];
  let delayMs = 0;
  const retryAfter = options.retryAfter ?? '120';
  let requests = 0;
  let refused = 0;
  const processed: ReceivedEvent[] = [];
  const seen = new Set<string>();
  const deliveries = new Map<string, number>();
  const open = new Set<ServerResponse>();
  const timers = new Set<NodeJS.Timeout>();

  const server: Server = createServer(async (req, res) => {
    open.add(res);
    res.on('close', () => open.delete(res));
    try {
      if (req.method !== 'POST') {
        res.writeHead(405).end();
        return;
      }
      requests++;
      const body = await readBody(req);
      const id = req.headers[WEBHOOK_HEADERS.id.toLowerCase()];
      if (typeof id === 'string') deliveries.set(id, (deliveries.get(id) ?? 0) + 1);
      if (delayMs > 0) {
        await new Promise<void>((resolve) => {
          const t = setTimeout(() => {
            timers.delete(t);
            resolve();
          }, delayMs);
          timers.add(t);
        });
        if (res.destroyed) return;
      }
      const fault = faults.shift();
      if (fault === 'timeout') return; // never answers; the sender's time-out ends it
      if (fault === '500') {
        res.writeHead(500, { 'content-type': 'text/plain' }).end('injected failure');
        return;
      }
      if (fault === '400') {
        res.writeHead(400, { 'content-type': 'text/plain' }).end('unknown event');
        return;
      }
      if (fault === '429') {
        res.writeHead(429, { 'content-type': 'text/plain', 'retry-after': retryAfter }).end('slow down');
        return;
      }
      if (fault === 'redirect') {
        res.writeHead(307, { location: '/elsewhere' }).end();
        return;
      }
      const check = verifyWebhook({ secret, headers: req.headers, body });
      if (!check.ok) {
        refused++;
        res.writeHead(401, { 'content-type': 'text/plain' }).end(`signature refused: ${check.reason}`);
        return;
      }
      // Process each event once; a repeated id was handled before and is only acknowledged.
      if (!seen.has(check.id)) {
        seen.add(check.id);
        processed.push({ id: check.id, body, host: req.headers.host, attempt: req.headers[WEBHOOK_HEADERS.attempt.toLowerCase()] as string | undefined, processedAt: new Date() });
      }
      if (fault === 'store-then-drop') {
        req.socket.destroy();
        return;
      }
      res.writeHead(200, { 'content-type': 'application/json' }).end('{"received":true}');
    } catch (e) {
      if (!res.headersSent) res.writeHead(500).end(e instanceof Error ? e.message : String(e));
    }
  });

  await new Promise<void>((resolve) => server.listen(options.port ?? 0, host, resolve));
  const port = (server.address() as AddressInfo).port;
  return {
    url: `http://${host}:${port}`,
    port,
    processed,
    deliveriesOf: (id) => deliveries.get(id) ?? 0,
    requestCount: () => requests,
    refusedCount: () => refused,
    setSecret: (s) => {
      secret = s;
    },
    setFaults: (f) => {
      faults = [...f];
    },
    setDelayMs: (ms) => {
      delayMs = ms;
    },
    clear: () => {
      processed.length = 0;
      seen.clear();
      deliveries.clear();
      requests = 0;
      refused = 0;
    },
    close: () =>
      new Promise<void>((resolve) => {
        for (const t of timers) clearTimeout(t);
        for (const res of open) res.socket?.destroy();
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
