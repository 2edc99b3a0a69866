// The client's address as Express reports it: the socket's peer, or what a trusted proxy (TRUST_PROXY) says.
import { isIPv6 } from 'node:net';
import type { Request } from 'express';

/** The request's address, IPv4-mapped IPv6 written as plain IPv4. */
export function clientAddress(req: Request): string {
  const ip = req.ip ?? req.socket.remoteAddress ?? '';
  return ip.startsWith('::ffff:') && ip.includes('.') ? ip.slice(7) : ip;
}

export function isLoopback(ip: string): boolean {
  return ip === '::1' || /^127\./.test(ip) || ip === '::ffff:127.0.0.1';
}

/**
 * The key for per-address limits: an IPv4 address as it is, an IPv6 address by its /64 network, since one
 * subscriber usually holds a whole /64 and could otherwise step through fresh addresses.
 */
export function addressBucket(ip: string): string {
  if (!isIPv6(ip)) return ip;
  const bare = ip.split('%')[0];
  if (bare.includes('.')) return bare;
  const [head, tail = ''] = bare.split('::');
  const h = head ? head.split(':') : [];
  const t = bare.includes('::') && tail ? tail.split(':') : [];
  const groups = bare.includes('::') ? [...h, ...Array(8 - h.length - t.length).fill('0'), ...t] : h;
  return `${groups
    .slice(0, 4)
    .map((g) => g.toLowerCase().padStart(4, '0'))
    .join(':')}::/64`;
}
