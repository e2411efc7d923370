// The local SMTP peer that stands in for the hosted mail relay: a real SMTP socket on 127.0.0.1
// that stores every message it accepts as an .eml file, and a small HTTP reader for developers
// and tests:  GET /  (HTML list)  ·  GET /api/messages  (JSON, parsed)  ·  GET /api/messages/:id.eml
// ·  DELETE /api/messages.
import { createServer } from 'node:http';
import { mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';
import escapeHtml from 'escape-html';

export async function startMailPeer({ smtpPort, httpPort, dir, log = console.log }) {
	const { SMTPServer } = await import('smtp-server');
	mkdirSync(dir, { recursive: true });
	const smtp = new SMTPServer({
		authOptional: true,
		disabledCommands: ['STARTTLS'],
		logger: false,
		onData(stream, session, callback) {
			const chunks = [];
			stream.on('data', (c) => chunks.push(c));
			stream.on('end', () => {
				const id = `${Date.now()}-${randomUUID().slice(0, 8)}`;
				const envelope = { from: session.envelope.mailFrom?.address, to: session.envelope.rcptTo.map((r) => r.address) };
				writeFileSync(join(dir, `${id}.eml`), Buffer.concat(chunks));
				writeFileSync(join(dir, `${id}.json`), JSON.stringify(envelope));
				callback(null, `stored as ${id}`);
			});
		}
	});
	await new Promise((resolve, reject) => {
		smtp.once('error', reject);
		smtp.listen(smtpPort, '127.0.0.1', resolve);
	});
	const http = createServer((req, res) => handleHttp(dir, req, res).catch((e) => fail(res, e)));
	await new Promise((resolve, reject) => {
		http.once('error', reject);
		http.listen(httpPort, '127.0.0.1', resolve);
	});
	log(`[restvolt] mail peer: SMTP 127.0.0.1:${smtpPort}, read mail at http://127.0.0.1:${httpPort}/`);
	return {
		smtpPort,
		httpPort,
		dir,
		stop: () => Promise.all([new Promise((r) => smtp.close(r)), new Promise((r) => http.close(r))])
	};
}

function fail(res, error) {
	res.writeHead(500, { 'content-type': 'text/plain' });
	res.end(String(error));
}

function messageIds(dir) {
	return readdirSync(dir)
		.filter((f) => f.endsWith('.eml'))
		.map((f) => f.slice(0, -4))
		.sort();
}

async function parseMessage(dir, id) {
	const { simpleParser } = await import('mailparser');
	const parsed = await simpleParser(readFileSync(join(dir, `${id}.eml`)));
	const envelope = JSON.parse(readFileSync(join(dir, `${id}.json`), 'utf8'));
	return {
		id,
		envelope,
		messageId: parsed.messageId ?? null,
		from: parsed.from?.text ?? '',
		to: parsed.to
			? [parsed.to]
					.flat()
					.map((a) => a.text)
					.join(', ')
			: '',
		subject: parsed.subject ?? '',
		date: parsed.date?.toISOString() ?? null,
		text: parsed.text ?? '',
		html: typeof parsed.html === 'string' ? parsed.html : '',
		attachments: parsed.attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, size: a.size }))
	};
}

async function handleHttp(dir, req, res) {
	const url = new URL(req.url ?? '/', 'http://127.0.0.1');
	if (req.method === 'DELETE' && url.pathname === '/api/messages') {
		for (const f of readdirSync(dir)) rmSync(join(dir, f));
		res.writeHead(204).end();
		return;
	}
	const raw = url.pathname.match(/^\/api\/messages\/([\w-]+)\.eml$/);
	if (raw) {
		res.writeHead(200, { 'content-type': 'message/rfc822' });
		res.end(readFileSync(join(dir, `${raw[1]}.eml`)));
		return;
	}
	const messages = await Promise.all(messageIds(dir).map((id) => parseMessage(dir, id)));
	if (url.pathname === '/api/messages') {
		res.writeHead(200, { 'content-type': 'application/json' });
		res.end(JSON.stringify(messages));
		return;
	}
	res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
	res.end(renderInbox(messages));
}

function renderInbox(messages) {
	const rows = messages
		.slice()
		.reverse()
		.map(
			(m) => `<article><h2>${escapeHtml(m.subject)}</h2><p><b>To:</b> ${escapeHtml(m.envelope.to.join(', '))} · ${escapeHtml(m.date ?? '')}
			· <a href="/api/messages/${m.id}.eml">raw</a>${m.attachments.map((a) => ` · 📎 ${escapeHtml(a.filename ?? 'attachment')}`).join('')}</p>
			<pre>${escapeHtml(m.text)}</pre></article>`
		)
		.join('');
	return `<!doctype html><meta charset="utf-8"><title>Restvolt local mail</title>
	<style>body{font:15px system-ui;margin:2rem;max-width:60rem;background:#f6f4ef}article{background:#fff;border:1px solid #d9d4c7;border-radius:8px;padding:1rem;margin:1rem 0}pre{white-space:pre-wrap}</style>
	<h1>Restvolt local mail peer</h1><p>${messages.length} message(s) received. Nothing here leaves this machine.</p>${rows || '<p>No mail yet.</p>'}`;
}
