/**
 * Where a webhook may be sent. In production an address inside the company's own network (private,
 * loopback, link-local, carrier-grade NAT, unspecified, unique-local) is refused, so a registered URL
 * cannot make the server call its own neighbours (SSRF). The check runs on the addresses the name
 * resolves to at delivery time, and the request then connects to exactly the address that was
 * checked (send.ts), so a name that changes its answer between check and connect gains nothing.
 * Outside production loopback targets are allowed, for the demo and the tests.
 */
import { lookup } from 'node:dns/promises';
import { BlockList, isIP } from 'node:net';

const INTERNAL = new BlockList();
for (const [network, prefix] of [
	['0.0.0.0', 8],
	['10.0.0.0', 8],
	['100.64.0.0', 10],
	['127.0.0.0', 8],
	['169.254.0.0', 16],
	['172.16.0.0', 12],
	['192.0.0.0', 24],
	['192.168.0.0', 16],
	['198.18.0.0', 15],
	['224.0.0.0', 4],
	['240.0.0.0', 4]
] as const)
	INTERNAL.addSubnet(network, prefix, 'ipv4');
for (const [network, prefix] of [
	['::', 128],
	['::1', 128],
	['fc00::', 7],
	['fe80::', 10],
	['ff00::', 8]
] as const)
	INTERNAL.addSubnet(network, prefix, 'ipv6');

/** An IPv4 address written as IPv6 (::ffff:10.0.0.1) is judged as the IPv4 address it is. */
function unmapped(address: string): string {
	const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/i.exec(address);
	return mapped ? mapped[1] : address;
}

export function isInternalAddress(address: string): boolean {
	const plain = unmapped(address);
	const family = isIP(plain);
	if (family === 0) return true; // not an address at all: never a safe target
	return INTERNAL.check(plain, family === 4 ? 'ipv4' : 'ipv6');
}

export const internalTargetsAllowed = (env: Record<string, string | undefined> = process.env) => env.NODE_ENV !== 'production';

export class RefusedTarget extends Error {}

export interface ResolvedTarget {
	address: string;
	family: 4 | 6;
}

/** The address to connect to for a webhook URL, or RefusedTarget when it is internal (in production). */
export async function resolveTarget(url: URL, allowInternal = internalTargetsAllowed()): Promise<ResolvedTarget> {
	const host = url.hostname.replace(/^\[(.*)\]$/, '$1');
	const answers = isIP(host) ? [{ address: host, family: isIP(host) }] : await lookup(host, { all: true, verbatim: true });
	if (answers.length === 0) throw new RefusedTarget(`${host} has no address`);
	const internal = answers.find((a) => isInternalAddress(a.address));
	if (internal && !allowInternal)
		throw new RefusedTarget(`${host} resolves to ${internal.address}, an internal address; webhooks go to public addresses only`);
	const first = answers[0];
	return { address: first.address, family: first.family === 6 ? 6 : 4 };
}
