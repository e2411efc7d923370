/** Reads what the local SMTP peer received (its HTTP reader), and runs private peers for fault tests. */
import { testEnv } from './env';
import { startMailPeer } from '../../scripts/lib/mail-peer.mjs';

export interface ReceivedMail {
	id: string;
	envelope: { from: string; to: string[] };
	messageId: string | null;
	from: string;
	to: string;
	subject: string;
	text: string;
	html: string;
	attachments: Array<{ filename: string; contentType: string; size: number }>;
}

export async function readMail(baseUrl = testEnv().mailHttpUrl): Promise<ReceivedMail[]> {
	const res = await fetch(`${baseUrl}/api/messages`);
	if (!res.ok) throw new Error(`mail reader answered ${res.status}`);
	return (await res.json()) as ReceivedMail[];
}

export async function rawMail(id: string, baseUrl = testEnv().mailHttpUrl): Promise<Buffer> {
	const res = await fetch(`${baseUrl}/api/messages/${id}.eml`);
	return Buffer.from(await res.arrayBuffer());
}

/** Mail sent to `address` (the shared peer holds mail from every test file). */
export async function mailTo(address: string, baseUrl?: string): Promise<ReceivedMail[]> {
	return (await readMail(baseUrl)).filter((m) => m.envelope.to.includes(address));
}

export async function waitForMail(
	predicate: (m: ReceivedMail) => boolean,
	{ timeoutMs = 15_000, baseUrl }: { timeoutMs?: number; baseUrl?: string } = {}
) {
	const deadline = Date.now() + timeoutMs;
	while (Date.now() < deadline) {
		const found = (await readMail(baseUrl)).filter(predicate);
		if (found.length) return found;
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error('expected mail did not arrive');
}

export interface PrivatePeer {
	smtpPort: number;
	httpUrl: string;
	stop: () => Promise<void>;
}

/** A mail peer of the test's own (e.g. to stop and start it during a fault test). */
export async function startPrivatePeer(smtpPort: number, httpPort: number, dir: string): Promise<PrivatePeer> {
	const peer = await startMailPeer({ smtpPort, httpPort, dir, log: () => {} });
	return { smtpPort, httpUrl: `http://127.0.0.1:${httpPort}`, stop: async () => void (await peer.stop()) };
}
