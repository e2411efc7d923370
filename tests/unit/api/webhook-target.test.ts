/**
 * Which webhook targets are refused in production (SSRF): address ranges from RFC 1918 (private
 * IPv4), RFC 1122 (loopback, "this network"), RFC 3927 (IPv4 link-local), RFC 6598 (shared
 * address space), RFC 4193 (IPv6 unique-local), RFC 4291 (IPv6 loopback, link-local, mapped IPv4).
 */
import { describe, expect, it } from 'vitest';
import { isInternalAddress, RefusedTarget, resolveTarget } from '$lib/server/webhooks/target';
import { scopeAllows, scopeFitsRole } from '$lib/server/token-scopes';

describe('isInternalAddress', () => {
	it.each([
		'127.0.0.1',
		'10.20.30.40',
		'172.16.0.1',
		'172.31.255.255',
		'192.168.1.1',
		'169.254.169.254',
		'100.64.0.1',
		'0.0.0.0',
		'::1',
		'::',
		'fd00::1',
		'fe80::1',
		'::ffff:10.0.0.1',
		'::ffff:127.0.0.1'
	])('%s is internal', (address) => expect(isInternalAddress(address)).toBe(true));
	it.each(['93.184.216.34', '172.32.0.1', '8.8.8.8', '2001:4860::1', '::ffff:8.8.8.8'])('%s is public', (address) =>
		expect(isInternalAddress(address)).toBe(false)
	);
});

describe('resolveTarget', () => {
	it('refuses a name that resolves to loopback when internal targets are not allowed, after resolving it', async () => {
		await expect(resolveTarget(new URL('http://localhost:8080/hook'), false)).rejects.toBeInstanceOf(RefusedTarget);
		await expect(resolveTarget(new URL('http://[::1]/hook'), false)).rejects.toBeInstanceOf(RefusedTarget);
	});
	it('gives the checked address to connect to when internal targets are allowed (outside production)', async () => {
		expect(await resolveTarget(new URL('http://127.0.0.1:9/hook'), true)).toEqual({ address: '127.0.0.1', family: 4 });
	});
});

describe('token scopes', () => {
	it('a read-only token reads and changes nothing', () => {
		expect(scopeAllows('read', 'lot:read')).toBe(true);
		expect(scopeAllows('read', 'reading:write')).toBe(false);
		expect(scopeAllows('read', 'lot:create')).toBe(false);
	});
	it('readings:write adds recording readings only; webhooks:manage is webhooks only', () => {
		expect(scopeAllows('readings:write', 'reading:write')).toBe(true);
		expect(scopeAllows('readings:write', 'lot:submit')).toBe(false);
		expect(scopeAllows('webhooks:manage', 'admin:webhooks')).toBe(true);
		expect(scopeAllows('webhooks:manage', 'lot:read')).toBe(false);
	});
	it('never gives a person more than their role', () => {
		expect(scopeFitsRole('readings:write', 'inspector')).toBe(true);
		expect(scopeFitsRole('readings:write', 'buyer')).toBe(false);
		expect(scopeFitsRole('webhooks:manage', 'admin')).toBe(true);
		expect(scopeFitsRole('webhooks:manage', 'quality')).toBe(false);
		expect(scopeFitsRole('read', 'supplier')).toBe(true);
	});
});
