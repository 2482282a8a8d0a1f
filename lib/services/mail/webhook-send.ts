import 'server-only';
/**
 * One webhook request, from the outbox worker only (never from a request
 * handler). The URL is checked again here, the host is resolved once, every
 * address it resolves to is checked, and the connection goes to a checked
 * address (the resolver is handed to the socket, so there is no second lookup
 * an attacker's DNS could answer differently). No redirect is followed, the
 * whole exchange is bounded by `timeoutMs`, and at most `maxResponseBytes` of
 * the answer are read.
 */
import { lookup as dnsLookup } from 'node:dns';
import { request as httpRequest, type IncomingMessage } from 'node:http';
import { request as httpsRequest } from 'node:https';
import type { LookupAddress } from 'node:dns';
import { checkAddress, checkWebhookUrl, type UrlPolicyOptions } from '@/lib/webhooks/url-policy';
import { signedHeaders } from '@/lib/webhooks/signature';

export type SendOutcome =
  | { kind: 'sent'; providerId: string }
  | { kind: 'retry'; error: string; /** The receiver's Retry-After, when it gave one. */ retryAfterMs?: number }
  | { kind: 'permanent'; error: string };

export type Resolver = (host: string) => Promise<LookupAddress[]>;

export interface WebhookSendOptions {
  timeoutMs: number;
  allowLoopback: boolean;
  allowPrivate: boolean;
  maxResponseBytes?: number;
  /** DNS for tests; default the system resolver (dns.lookup, all addresses). */
  resolve?: Resolver;
  now?: () => Date;
}

export const MAX_RETRY_AFTER_MS = 3_600_000;
const RETRYABLE = new Set([408, 425, 429]);
const USER_AGENT = 'LatticeLedger-Webhooks/1';

const systemResolve: Resolver = (host) =>
  new Promise((resolve, reject) => dnsLookup(host, { all: true, verbatim: true }, (err, addresses) => (err ? reject(err) : resolve(addresses))));

class PolicyRefusal extends Error {}

/** Retry-After as seconds or an HTTP date (RFC 9110 §10.2.3), in ms from `now`, capped at an hour; undefined when absent or unreadable. */
export function retryAfterMs(value: string | undefined, now: Date): number | undefined {
  if (!value) return undefined;
  const text = value.trim();
  // an HTTP date names its day and month in letters; anything else that is not whole seconds is unreadable
  const ms = /^\d+$/.test(text) ? Number(text) * 1000 : /^[A-Za-z]{3},? /.test(text) ? Date.parse(text) - now.getTime() : NaN;
  if (!Number.isFinite(ms)) return undefined;
  return Math.min(Math.max(0, ms), MAX_RETRY_AFTER_MS);
}

function pinnedLookup(resolve: Resolver, policy: UrlPolicyOptions, seen: string[]) {
  return (hostname: string, options: { family?: number | string; all?: boolean }, callback: (...args: unknown[]) => void) => {
    resolve(hostname)
      .then((addresses) => {
        if (addresses.length === 0) throw Object.assign(new Error(`${hostname} has no address`), { code: 'ENOTFOUND' });
        // Every address must pass, not just the first: the socket may try any of them.
        for (const a of addresses) {
          const check = checkAddress(a.address, policy);
          if (!check.ok) throw new PolicyRefusal(`${hostname} resolves to ${check.reason}`);
        }
        const family = options.family === 'IPv4' ? 4 : options.family === 'IPv6' ? 6 : Number(options.family ?? 0);
        const wanted = family ? addresses.filter((a) => a.family === family) : addresses;
        if (wanted.length === 0) throw Object.assign(new Error(`${hostname} has no IPv${family} address`), { code: 'ENOTFOUND' });
        seen.push(...wanted.map((a) => a.address));
        if (options.all) callback(null, wanted);
        else callback(null, wanted[0].address, wanted[0].family);
      })
      .catch((error: unknown) => callback(error));
  };
}

function readBounded(res: IncomingMessage, max: number): Promise<string> {
  return new Promise((resolve) => {
    const chunks: Buffer[] = [];
    let size = 0;
    const done = () => resolve(Buffer.concat(chunks).toString('utf8'));
    res.on('data', (chunk: Buffer) => {
      const room = max - size;
      if (room > 0) chunks.push(chunk.subarray(0, room));
      size += chunk.length;
      // Enough for an error message: stop reading, whatever the receiver still sends.
      if (size >= max) {
        res.destroy();
        done();
      }
    });
    res.on('end', done);
    res.on('error', done);
    res.on('close', done);
  });
}

const oneLine = (text: string) => text.replace(/\s+/g, ' ').trim().slice(0, 300);

/** Posts one signed delivery. `attempt` counts from 1 and is sent as Ledger-Webhook-Attempt. */
export async function sendWebhook(
  delivery: { id: string; url: string; body: string; secret: string; attempt: number },
  options: WebhookSendOptions,
): Promise<SendOutcome> {
  const policy = { allowLoopback: options.allowLoopback, allowPrivate: options.allowPrivate };
  const checked = checkWebhookUrl(delivery.url, policy);
  if (!checked.ok) return { kind: 'permanent', error: `refused: ${checked.reason}` };
  const now = options.now ?? (() => new Date());
  const headers = {
    'content-type': 'application/json',
    'user-agent': USER_AGENT,
    'content-length': String(Buffer.byteLength(delivery.body)),
    ...signedHeaders({ id: delivery.id, secret: delivery.secret, body: delivery.body, now: now(), attempt: delivery.attempt }),
  };
  const seen: string[] = [];
  const request = checked.url.protocol === 'https:' ? httpsRequest : httpRequest;
  const max = options.maxResponseBytes ?? 4096;

  return new Promise<SendOutcome>((settle) => {
    let finished = false;
    const finish = (outcome: SendOutcome) => {
      if (finished) return;
      finished = true;
      clearTimeout(timer);
      settle(outcome);
    };
    const req = request(
      checked.url,
      {
        method: 'POST',
        headers,
        // A fresh connection each time: nothing pooled that was resolved for another request.
        agent: false,
        lookup: checked.literal ? undefined : (pinnedLookup(options.resolve ?? systemResolve, policy, seen) as never),
      },
      (res) => {
        void readBounded(res, max).then((text) => {
          const status = res.statusCode ?? 0;
          const answer = `${status}${text ? ` ${oneLine(text)}` : ''}`;
          if (status >= 200 && status < 300) return finish({ kind: 'sent', providerId: `HTTP ${status}` });
          if (status >= 300 && status < 400) return finish({ kind: 'permanent', error: `${status}: redirects are not followed (Location: ${oneLine(String(res.headers.location ?? '—'))})` });
          const retryable = status >= 500 || RETRYABLE.has(status);
          if (!retryable) return finish({ kind: 'permanent', error: answer });
          const after = retryAfterMs(typeof res.headers['retry-after'] === 'string' ? res.headers['retry-after'] : undefined, now());
          finish({ kind: 'retry', error: answer, ...(after === undefined ? {} : { retryAfterMs: after }) });
        });
      },
    );
    const timer = setTimeout(() => {
      req.destroy(new Error(`no complete answer within ${options.timeoutMs} ms`));
    }, options.timeoutMs);
    req.on('error', (error: Error & { code?: string }) => {
      if (error instanceof PolicyRefusal) return finish({ kind: 'permanent', error: `refused: ${error.message}` });
      const where = seen.length ? ` (${seen[0]})` : '';
      finish({ kind: 'retry', error: `${error.code ? `${error.code} ` : ''}${error.message}${where}` });
    });
    req.end(delivery.body);
  });
}
