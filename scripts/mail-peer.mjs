#!/usr/bin/env node
// Run the local SMTP peer on its own: SMTP_PORT (default 2525), MAIL_HTTP_PORT (default 8025), MAIL_DIR.
import { resolve } from 'node:path';
import { startMailPeer } from './lib/mail-peer.mjs';

const peer = await startMailPeer({
	smtpPort: Number(process.env.SMTP_PORT ?? 2525),
	httpPort: Number(process.env.MAIL_HTTP_PORT ?? 8025),
	dir: resolve(process.env.MAIL_DIR ?? '.data/mail')
});
const stop = () => peer.stop().then(() => process.exit(0));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
