import { BlockList, isIP } from 'node:net';

/*
 * Where a webhook may be posted. A company types the address, so without limits NookPass could be made to
 * call its own network (SSRF): cloud metadata at 169.254.169.254, a database on 10.x, the app on 127.0.0.1.
 * Private, link-local, shared, multicast and reserved ranges are refused always; loopback (a receiver on the
 * same machine) only outside production or with NOOKPASS_WEBHOOKS_ALLOW_LOCAL=1, so tests can run one. Names
 * are checked again when they are resolved for each delivery, so a name that later points inside is refused.
 */

const blocked = new BlockList();
// IPv4: "this network" (RFC 791), private (RFC 1918), shared address space (RFC 6598), link-local (RFC 3927),
// IETF protocol assignments (RFC 6890), benchmarking (RFC 2544), documentation (RFC 5737), multicast (RFC 5771),
// reserved and broadcast (RFC 1112, RFC 919).
for (const [net, prefix] of [
  ['0.0.0.0', 8], ['10.0.0.0', 8], ['100.64.0.0', 10], ['169.254.0.0', 16], ['172.16.0.0', 12], ['192.0.0.0', 24],
  ['192.0.2.0', 24], ['192.168.0.0', 16], ['198.18.0.0', 15], ['198.51.100.0', 24], ['203.0.113.0', 24], ['224.0.0.0', 4], ['240.0.0.0', 4],
] as const) blocked.addSubnet(net, prefix, 'ipv4');
// IPv6: unspecified (RFC 4291), unique local (RFC 4193), link-local (RFC 4291), site-local (deprecated, RFC 3879),
// documentation (RFC 3849), multicast (RFC 4291). IPv4-mapped addresses are checked against the IPv4 ranges.
blocked.addAddress('::', 'ipv6');
for (const [net, prefix] of [['fc00::', 7], ['fe80::', 10], ['fec0::', 10], ['2001:db8::', 32], ['ff00::', 8]] as const) blocked.addSubnet(net, prefix, 'ipv6');

const loopback = new BlockList();
loopback.addSubnet('127.0.0.0', 8, 'ipv4'); // RFC 1122 3.2.1.3
loopback.addAddress('::1', 'ipv6'); // RFC 4291 2.5.3

/** Loopback receivers are allowed outside production, or with NOOKPASS_WEBHOOKS_ALLOW_LOCAL=1. */
export function localReceiversAllowed(): boolean {
  return process.env.NODE_ENV !== 'production' || process.env.NOOKPASS_WEBHOOKS_ALLOW_LOCAL === '1';
}

const bare = (host: string) => (host.startsWith('[') && host.endsWith(']') ? host.slice(1, -1) : host);

/** "localhost" and names under it always mean this machine (RFC 6761 6.3). */
function isLocalhostName(host: string): boolean {
  const h = host.toLowerCase().replace(/\.$/, '');
  return h === 'localhost' || h.endsWith('.localhost');
}

function isLoopback(host: string): boolean {
  const h = bare(host);
  const family = isIP(h);
  if (family === 0) return isLocalhostName(h);
  return loopback.check(h, family === 6 ? 'ipv6' : 'ipv4');
}

/** Why an address (IP literal) may not receive webhooks, or null when it may. */
export function addressProblem(address: string, allowLoopback: boolean): string | null {
  const a = bare(address);
  const family = isIP(a);
  if (family === 0) return null;
  const type = family === 6 ? 'ipv6' : 'ipv4';
  if (loopback.check(a, type)) return allowLoopback ? null : 'The address points at this server (loopback); use the endpoint’s public address.';
  if (blocked.check(a, type)) return 'The address is private, link-local or reserved; webhooks go to public addresses only.';
  return null;
}

/**
 * Why a webhook URL may not be used here, or null. Plain http is for a loopback receiver where local receivers
 * are allowed; everything else needs https. Names other than localhost are checked when they are resolved.
 */
export function webhookTargetProblem(rawUrl: string, allowLoopback = localReceiversAllowed()): string | null {
  let url: URL;
  try {
    url = new URL(rawUrl);
  } catch {
    return 'Enter the full address of the endpoint, starting with https://.';
  }
  const host = url.hostname;
  if (url.protocol === 'http:' && !(allowLoopback && isLoopback(host))) {
    return allowLoopback ? 'The address must start with https:// (plain http only for a receiver on this machine).' : 'The address must start with https://.';
  }
  if (url.protocol !== 'https:' && url.protocol !== 'http:') return 'The address must start with https://.';
  if (isLocalhostName(host)) return allowLoopback ? null : 'The address points at this server (localhost); use the endpoint’s public address.';
  return addressProblem(host, allowLoopback);
}
