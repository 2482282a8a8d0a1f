import 'server-only';
import { BlockList, isIP } from 'node:net';
import { timingSafeEqual } from 'node:crypto';
import { env } from '@/lib/env';
import { envValue } from '@/lib/env';

/**
 * Who is on the other end of the socket, and who the client is.
 *
 * Route handlers do not see the TCP peer. scripts/server.mjs (the server every script starts) writes it into
 * PEER_HEADER on every request as "<key> <address>", overwriting anything the client sent; the key is a random
 * per-process value in LEDGER_PEER_KEY. A header without the right key (or a process started some other way)
 * gives no address at all: callers then fall back to one shared bucket, never to a client-chosen one.
 */
export const PEER_HEADER = 'x-ledger-peer';

/** IPv4-mapped IPv6 ("::ffff:192.0.2.1") as IPv4; anything that is not an IP address is null. */
export function normaliseAddress(raw: string | null | undefined): string | null {
  if (!raw) return null;
  let a = raw.trim();
  if (a.startsWith('[') && a.endsWith(']')) a = a.slice(1, -1);
  const zone = a.indexOf('%');
  if (zone >= 0) a = a.slice(0, zone);
  const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/i.exec(a);
  if (mapped) a = mapped[1];
  const family = isIP(a);
  if (family === 0) return null;
  return family === 6 ? a.toLowerCase() : a;
}

function sameKey(a: string, b: string): boolean {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}

interface Peer {
  address: string;
  /** The client sent a forwarding header (X-Forwarded-For, Forwarded or X-Real-IP). */
  forwarded: boolean;
}

/** The stamp our server wrote, or null when the request did not come through it. */
function peer(headers: Headers): Peer | null {
  const key = envValue('LEDGER_PEER_KEY');
  const value = headers.get(PEER_HEADER);
  if (!key || !value) return null;
  const [stampKey, rawAddress, how] = value.split(' ');
  if (!stampKey || !sameKey(stampKey, key)) return null;
  const address = normaliseAddress(rawAddress);
  return address ? { address, forwarded: how !== 'direct' } : null;
}

/** The TCP peer's address as stamped by our server, or null when the request did not come through it. */
export function socketAddress(headers: Headers): string | null {
  return peer(headers)?.address ?? null;
}

/** Parses TRUSTED_PROXIES ("10.0.0.1, 10.1.0.0/16, ::1"); throws on an entry that is not an address or CIDR range. */
export function parseTrustedProxies(list: string): BlockList | null {
  const entries = list.split(',').map((s) => s.trim()).filter(Boolean);
  if (entries.length === 0) return null;
  const block = new BlockList();
  for (const entry of entries) {
    const [addr, prefix, extra] = entry.split('/');
    const ip = normaliseAddress(addr);
    const family = ip ? (isIP(ip) === 6 ? 'ipv6' : 'ipv4') : null;
    const max = family === 'ipv6' ? 128 : 32;
    if (!ip || !family || extra !== undefined || (prefix !== undefined && !(/^\d+$/.test(prefix) && Number(prefix) <= max))) {
      throw new Error(`TRUSTED_PROXIES: "${entry}" is not an IP address or CIDR range (e.g. 10.0.0.0/8).`);
    }
    if (prefix === undefined) block.addAddress(ip, family);
    else block.addSubnet(ip, Number(prefix), family);
  }
  return block;
}

let trustedCache: { list: string; block: BlockList | null } | undefined;
function trustedProxies(): BlockList | null {
  const list = env().TRUSTED_PROXIES;
  if (trustedCache?.list !== list) trustedCache = { list, block: parseTrustedProxies(list) };
  return trustedCache.block;
}

function isTrusted(block: BlockList, address: string): boolean {
  return block.check(address, isIP(address) === 6 ? 'ipv6' : 'ipv4');
}

/**
 * The client's address: the socket peer, unless the peer is a trusted proxy (TRUSTED_PROXIES), in which case
 * X-Forwarded-For is read from the right, skipping trusted hops, and the first untrusted hop is the client.
 * A forwarded header from anyone else is ignored. Null when the request did not come through our server.
 */
export function clientAddress(headers: Headers): string | null {
  const peer = socketAddress(headers);
  if (!peer) return null;
  const trusted = trustedProxies();
  if (!trusted || !isTrusted(trusted, peer)) return peer;
  const chain = (headers.get('x-forwarded-for') ?? '').split(',').map((s) => s.trim()).filter(Boolean);
  let client = peer;
  for (let i = chain.length - 1; i >= 0; i--) {
    const hop = normaliseAddress(chain[i]);
    // A malformed hop was written by someone we do not trust: stop at the last address a trusted proxy vouched for.
    if (!hop) return client;
    client = hop;
    if (!isTrusted(trusted, hop)) return hop;
  }
  return client;
}

/** A rate-limit key for an address: IPv6 clients usually hold a whole /64, so they share one key. */
export function addressKey(address: string | null): string {
  if (!address) return 'unknown';
  if (isIP(address) !== 6) return address;
  const groups = expandIPv6(address);
  return `${groups.slice(0, 4).join(':')}::/64`;
}

function expandIPv6(a: string): string[] {
  const [left, right] = a.includes('::') ? a.split('::') : [a, undefined];
  const l = left ? left.split(':') : [];
  const r = right ? right.split(':') : [];
  const fill = right === undefined ? [] : Array(8 - l.length - r.length).fill('0');
  return [...l, ...fill, ...r].map((g) => g.padStart(4, '0'));
}

export function isLoopback(address: string | null): boolean {
  if (!address) return false;
  if (address === '::1') return true;
  return isIP(address) === 4 && address.startsWith('127.');
}

/**
 * A request straight from this machine: the TCP peer is a loopback address and no proxy forwarded it
 * (a reverse proxy on the same host connects from loopback on behalf of anyone).
 */
export function isDirectLoopback(headers: Headers): boolean {
  const p = peer(headers);
  return !!p && !p.forwarded && isLoopback(p.address);
}

/** The header value scripts/server.mjs would write (for tests that call handlers directly). */
export function peerStamp(address: string, forwarded = false): string {
  return `${envValue('LEDGER_PEER_KEY') ?? ''} ${address} ${forwarded ? 'forwarded' : 'direct'}`;
}
