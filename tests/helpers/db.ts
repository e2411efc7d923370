/**
 * Each test file gets its own database, copied from a migrated and seeded template, so files
 * cannot disturb each other. By default it holds the whole demo scenario (thirty lots with their
 * history); `{ demo: false }` gives the same people, models and parts without any lots, for tests
 * whose expectations depend on a supplier × part having no lot history (e.g. normal inspection).
 */
import pg from 'pg';
import { randomBytes } from 'node:crypto';
import { APP_ROLE, OWNER_ROLE, urlAs } from '../../scripts/lib/roles.mjs';
import { testEnv } from './env';

export interface FreshDatabase {
	/** Superuser URL: for the tests' own setup and assertions. */
	url: string;
	/** As the owner role (migrations, seed). */
	ownerUrl: string;
	/** As the app's role (startApp connects with it whatever URL it is given). */
	appUrl: string;
	name: string;
	drop: () => Promise<void>;
}

export async function freshDatabase(label = 'db', { demo = true }: { demo?: boolean } = {}): Promise<FreshDatabase> {
	const { pgUrl, templateDb: demoDb, baseDb } = testEnv();
	const templateDb = demo ? demoDb : baseDb;
	const name = `t_${label.replace(/\W/g, '_').slice(0, 30)}_${randomBytes(4).toString('hex')}`;
	// The copy keeps the template's table owners and grants; the database itself is the owner role's too.
	await admin(`create database "${name}" template "${templateDb}" owner "${OWNER_ROLE}"`);
	const url = `${pgUrl}/${name}`;
	return {
		url,
		ownerUrl: urlAs(url, OWNER_ROLE),
		appUrl: urlAs(url, APP_ROLE),
		name,
		drop: () => admin(`drop database if exists "${name}" with (force)`)
	};
}

async function admin(sql: string) {
	const client = new pg.Client({ connectionString: `${testEnv().pgUrl}/postgres` });
	await client.connect();
	try {
		await client.query(sql);
	} finally {
		await client.end();
	}
}

/** A short-lived client for assertions on the database. */
export async function withClient<T>(url: string, fn: (client: pg.Client) => Promise<T>): Promise<T> {
	const client = new pg.Client({ connectionString: url });
	await client.connect();
	try {
		return await fn(client);
	} finally {
		await client.end();
	}
}
