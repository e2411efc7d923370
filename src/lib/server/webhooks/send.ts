/**
 * One webhook POST: the stored body, signed with the endpoint's secret, sent to the address that
 * target.ts checked (the connection is pinned to it; TLS still verifies the URL's host name).
 */
import { createHmac } from 'node:crypto';
import http from 'node:http';
import https from 'node:https';
import type { LookupFunction } from 'node:net';
import { resolveTarget, type ResolvedTarget } from './target';

/** How long a receiver may take to answer before the attempt counts as failed. */
const TIMEOUT_MS = 10_000;

/** `sha256=<hex HMAC-SHA256 of the raw body with the secret>`, as receivers check it. */
export const signatureOf = (body: string, secret: string) => `sha256=${createHmac('sha256', secret).update(body).digest('hex')}`;

export interface WebhookPost {
	url: string;
	event: string;
	deliveryId: string;
	body: string;
	secret: string;
}

/** The receiver's status code (any), or an error when no answer came (refused, timed out, internal target). */
export async function postWebhook(post: WebhookPost): Promise<number> {
	const url = new URL(post.url);
	const target = await resolveTarget(url);
	return send(url, target, post);
}

function pinnedLookup(target: ResolvedTarget): LookupFunction {
	return (_hostname, options, callback) => {
		if (options.all) callback(null, [{ address: target.address, family: target.family }]);
		else callback(null, target.address, target.family);
	};
}

function send(url: URL, target: ResolvedTarget, post: WebhookPost): Promise<number> {
	const client = url.protocol === 'https:' ? https : http;
	return new Promise((resolve, reject) => {
		const request = client.request(
			url,
			{
				method: 'POST',
				lookup: pinnedLookup(target),
				timeout: TIMEOUT_MS,
				headers: {
					'content-type': 'application/json',
					'content-length': Buffer.byteLength(post.body),
					'user-agent': 'Restvolt-Webhooks/1',
					'x-restvolt-event': post.event,
					'x-restvolt-delivery': post.deliveryId,
					'x-restvolt-signature': signatureOf(post.body, post.secret)
				}
			},
			(response) => {
				response.resume(); // the body is not needed; read it so the socket is freed
				response.on('end', () => resolve(response.statusCode ?? 0));
				response.on('error', reject);
			}
		);
		request.on('timeout', () => request.destroy(new Error(`no answer within ${TIMEOUT_MS / 1000} s`)));
		request.on('error', reject);
		request.end(post.body);
	});
}
