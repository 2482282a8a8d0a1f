/**
 * Where a webhook may be sent. Pure: the URL is checked as written when it is
 * saved, and every address its host resolves to is checked again at send time
 * (lib/services/mail/webhook-send.ts connects only to an address that passed).
 *
 * - https only; plain http only to a loopback host, and loopback only when the
 *   caller allows it (development, tests, or WEBHOOK_ALLOW_LOOPBACK=1).
 * - no user name or password in the URL.
 * - private-network targets (RFC 1918, link-local, CGNAT, unique-local, the
 *   reserved and documentation ranges, 6to4/NAT64 forms of those) only when the
 *   workspace owner allows them; the unspecified address, multicast, broadcast,
 *   IPv4-mapped IPv6 and the cloud metadata addresses never.
 *
 * Ranges: IANA IPv4 and IPv6 Special-Purpose Address Registries (RFC 6890 and
 * its updates), RFC 1918, RFC 6598 (100.64/10), RFC 4193 (fc00::/7), RFC 4291.
 */
import { isIP } from 'node:net';

export type AddressClass =
  | 'public'
  | 'loopback'
  | 'private'
  | 'link-local'
  | 'cgnat'
  | 'unique-local'
  | 'reserved'
  | 'metadata'
  | 'unspecified'
  | 'multicast'
  | 'broadcast'
  | 'ipv4-mapped';

/** Classes an owner may open for the workspace ("allow private-network targets"). */
const PRIVATE_CLASSES: ReadonlySet<AddressClass> = new Set(['private', 'link-local', 'cgnat', 'unique-local', 'reserved']);

const CLASS_WORDS: Record<AddressClass, string> = {
  public: 'a public address',
  loopback: 'a loopback address (this machine)',
  private: 'a private-network address (RFC 1918)',
  'link-local': 'a link-local address',
  cgnat: 'a carrier-grade NAT address (100.64.0.0/10)',
  'unique-local': 'a unique-local IPv6 address (fc00::/7)',
  reserved: 'a reserved or documentation address',
  metadata: 'a cloud metadata address',
  unspecified: 'the unspecified address',
  multicast: 'a multicast address',
  broadcast: 'the broadcast address',
  'ipv4-mapped': 'an IPv4-mapped IPv6 address',
};

export interface UrlPolicyOptions {
  /** http:// and loopback hosts are accepted (development and tests only). */
  allowLoopback: boolean;
  /** The workspace owner allows private-network targets. */
  allowPrivate: boolean;
}

function ipv4ToInt(ip: string): number {
  const parts = ip.split('.').map(Number);
  return ((parts[0] << 24) | (parts[1] << 16) | (parts[2] << 8) | parts[3]) >>> 0;
}

const v4 = (cidr: string): [number, number] => {
  const [base, bits] = cidr.split('/');
  return [ipv4ToInt(base), Number(bits)];
};

function inV4(ip: number, [base, bits]: [number, number]): boolean {
  if (bits === 0) return true;
  const mask = (~0 << (32 - bits)) >>> 0;
  return ((ip & mask) >>> 0) === ((base & mask) >>> 0);
}

const V4_RANGES: Array<[AddressClass, [number, number]]> = [
  ['metadata', v4('169.254.169.254/32')],
  ['broadcast', v4('255.255.255.255/32')],
  ['unspecified', v4('0.0.0.0/8')],
  ['loopback', v4('127.0.0.0/8')],
  ['private', v4('10.0.0.0/8')],
  ['private', v4('172.16.0.0/12')],
  ['private', v4('192.168.0.0/16')],
  ['link-local', v4('169.254.0.0/16')],
  ['cgnat', v4('100.64.0.0/10')],
  ['multicast', v4('224.0.0.0/4')],
  ['reserved', v4('240.0.0.0/4')],
  ['reserved', v4('192.0.0.0/24')],
  ['reserved', v4('192.0.2.0/24')],
  ['reserved', v4('198.18.0.0/15')],
  ['reserved', v4('198.51.100.0/24')],
  ['reserved', v4('203.0.113.0/24')],
  ['reserved', v4('192.88.99.0/24')],
];

function classifyV4Int(ip: number): AddressClass {
  for (const [cls, range] of V4_RANGES) if (inV4(ip, range)) return cls;
  return 'public';
}

/** Eight 16-bit groups of a valid IPv6 address (an embedded dotted IPv4 tail included). */
function ipv6Groups(ip: string): number[] {
  let text = ip.toLowerCase();
  const zone = text.indexOf('%');
  if (zone >= 0) text = text.slice(0, zone);
  const tail = /(\d+\.\d+\.\d+\.\d+)$/.exec(text);
  if (tail) {
    const n = ipv4ToInt(tail[1]);
    text = text.slice(0, -tail[1].length) + `${(n >>> 16).toString(16)}:${(n & 0xffff).toString(16)}`;
  }
  const [head, rest] = text.split('::');
  const left = head ? head.split(':') : [];
  const right = rest === undefined ? [] : rest ? rest.split(':') : [];
  const fill = rest === undefined ? 0 : 8 - left.length - right.length;
  return [...left, ...Array.from({ length: fill }, () => '0'), ...right].map((g) => parseInt(g, 16));
}

function classifyV6(ip: string): AddressClass {
  const g = ipv6Groups(ip);
  const embeddedV4 = (hi: number, lo: number) => ((hi << 16) | lo) >>> 0;
  const zeroUpTo = (n: number) => g.slice(0, n).every((x) => x === 0);
  if (zeroUpTo(8)) return 'unspecified';
  if (zeroUpTo(7) && g[7] === 1) return 'loopback';
  if (zeroUpTo(5) && g[5] === 0xffff) return 'ipv4-mapped';
  if (zeroUpTo(6)) return 'reserved'; // IPv4-compatible (deprecated, RFC 4291 §2.5.5.1)
  // NAT64 well-known prefix 64:ff9b::/96 and 6to4 2002::/16 carry an IPv4 address: judge that one.
  if (g[0] === 0x64 && g[1] === 0xff9b && g.slice(2, 6).every((x) => x === 0)) return publicOr(classifyV4Int(embeddedV4(g[6], g[7])));
  if (g[0] === 0x2002) return publicOr(classifyV4Int(embeddedV4(g[1], g[2])));
  if (g[0] === 0xfd00 && g[1] === 0x0ec2 && g.slice(2, 7).every((x) => x === 0) && g[7] === 0x254) return 'metadata';
  if ((g[0] & 0xfe00) === 0xfc00) return 'unique-local';
  if ((g[0] & 0xffc0) === 0xfe80) return 'link-local';
  if ((g[0] & 0xff00) === 0xff00) return 'multicast';
  if (g[0] === 0x2001 && g[1] === 0x0db8) return 'reserved'; // documentation
  if (g[0] === 0x0100 && g.slice(1, 4).every((x) => x === 0)) return 'reserved'; // discard-only 100::/64
  if ((g[0] & 0xe000) !== 0x2000) return 'reserved'; // outside global unicast 2000::/3
  return 'public';
}

/** A translated address is only as public as the IPv4 address inside it; a loopback one is not loopback here. */
function publicOr(cls: AddressClass): AddressClass {
  return cls === 'public' ? 'public' : cls === 'loopback' ? 'reserved' : cls;
}

/** The class of an IP address (v4 or v6, no brackets); 'reserved' for text that is not an IP address. */
export function classifyAddress(ip: string): AddressClass {
  const version = isIP(ip);
  if (version === 4) return classifyV4Int(ipv4ToInt(ip));
  if (version === 6) return classifyV6(ip);
  return 'reserved';
}

export type AddressCheck = { ok: true; class: AddressClass } | { ok: false; class: AddressClass; reason: string };

/** May a webhook connect to this address? */
export function checkAddress(ip: string, options: UrlPolicyOptions): AddressCheck {
  const cls = classifyAddress(ip);
  if (cls === 'public') return { ok: true, class: cls };
  if (cls === 'loopback') {
    return options.allowLoopback ? { ok: true, class: cls } : { ok: false, class: cls, reason: `${ip} is ${CLASS_WORDS[cls]}; only allowed in development and tests.` };
  }
  if (PRIVATE_CLASSES.has(cls)) {
    return options.allowPrivate
      ? { ok: true, class: cls }
      : { ok: false, class: cls, reason: `${ip} is ${CLASS_WORDS[cls]}; a workspace owner can allow private-network targets under Settings → Webhooks.` };
  }
  return { ok: false, class: cls, reason: `${ip} is ${CLASS_WORDS[cls]}, never a webhook target.` };
}

export const MAX_WEBHOOK_URL_LENGTH = 2000;

export type UrlCheck =
  | { ok: true; url: URL; /** Host without IPv6 brackets. */ host: string; /** The host is an IP address, so no DNS is involved. */ literal: boolean }
  | { ok: false; reason: string };

function isLoopbackName(host: string): boolean {
  return host === 'localhost' || host.endsWith('.localhost');
}

/**
 * Checks a webhook URL as written. A host name passes here when it is not a
 * loopback name; what it resolves to is checked at send time.
 */
export function checkWebhookUrl(raw: string, options: UrlPolicyOptions): UrlCheck {
  const text = raw.trim();
  if (text.length === 0) return { ok: false, reason: 'Give a URL.' };
  if (text.length > MAX_WEBHOOK_URL_LENGTH) return { ok: false, reason: `A webhook URL has at most ${MAX_WEBHOOK_URL_LENGTH} characters.` };
  let url: URL;
  try {
    url = new URL(text);
  } catch {
    return { ok: false, reason: 'Not a URL: write it in full, e.g. https://hooks.example.org/ledger.' };
  }
  if (url.protocol !== 'https:' && url.protocol !== 'http:') return { ok: false, reason: `${url.protocol.replace(':', '')}: URLs are not allowed: use https.` };
  if (url.username || url.password) return { ok: false, reason: 'No user name or password in the URL: the signature authenticates each delivery.' };
  const host = url.hostname.replace(/^\[|\]$/g, '').toLowerCase();
  if (!host) return { ok: false, reason: 'The URL has no host.' };
  const literal = isIP(host) !== 0;
  const loopback = literal ? classifyAddress(host) === 'loopback' : isLoopbackName(host);
  if (url.protocol === 'http:' && !(loopback && options.allowLoopback)) {
    return { ok: false, reason: options.allowLoopback ? 'Use https (plain http only to this machine, in development and tests).' : 'Use https.' };
  }
  if (loopback && !options.allowLoopback) return { ok: false, reason: `${host} is this machine; loopback targets are only allowed in development and tests.` };
  if (literal) {
    const check = checkAddress(host, options);
    if (!check.ok) return { ok: false, reason: check.reason };
  }
  url.hash = '';
  return { ok: true, url, host, literal };
}
