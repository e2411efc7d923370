/** What `npm test` (scripts/test.mjs) hands to the tests. */
export function testEnv() {
	const need = (name: string) => {
		const value = process.env[name];
		if (!value) throw new Error(`${name} is not set: run the tests through \`npm test\``);
		return value;
	};
	return {
		pgUrl: need('TEST_PG_URL'),
		pgBin: need('TEST_PG_BIN'),
		pgData: need('TEST_PG_DATA'),
		templateDb: need('TEST_TEMPLATE_DB'),
		baseDb: process.env.TEST_BASE_DB ?? 'restvolt_base',
		smtpPort: Number(need('TEST_SMTP_PORT')),
		mailHttpUrl: need('TEST_MAIL_HTTP_URL'),
		scratch: need('TEST_SCRATCH')
	};
}
