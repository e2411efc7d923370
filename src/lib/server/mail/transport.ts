/**
 * The one SMTP transport: plain SMTP to the relay named by SMTP_URL (the local peer in development
 * and tests). Used by sign-in links, password resets, invitations and supplier notices.
 */
import nodemailer from 'nodemailer';

export interface SmtpOptions {
	host: string;
	port: number;
	secure: false;
	ignoreTLS: true;
}

/** Host and port from SMTP_URL (e.g. smtp://127.0.0.1:2525). */
export function smtpOptions(smtpUrl = process.env.SMTP_URL): SmtpOptions {
	if (!smtpUrl) throw new Error('SMTP_URL is not set (npm start and npm test set it for you)');
	const url = new URL(smtpUrl);
	return { host: url.hostname, port: Number(url.port || 25), secure: false, ignoreTLS: true };
}

/** The sender address for everything Restvolt mails. */
export function mailFrom(): string {
	return process.env.MAIL_FROM ?? 'Restvolt <no-reply@restvolt.local>';
}

/**
 * Timeouts keep a dead relay from hanging a request or the outbox worker (whose lease is longer
 * than these, so a lease never runs out while a send is still in flight).
 */
export function createTransport(smtpUrl?: string) {
	return nodemailer.createTransport({ ...smtpOptions(smtpUrl), connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 30_000 });
}
