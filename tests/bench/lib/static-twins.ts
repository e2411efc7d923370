/**
 * Static "twins" of API responses: files with the very bytes an endpoint answered, put into the
 * build's client folder so the same server hands them out as static assets (the floors of the
 * HTTP operations). adapter-node's sirv lists that folder once at start-up, so the files are written
 * from a first app process and measured on a second one.
 */
import { writeFileSync } from 'node:fs';
import { syntheticReadings } from './data';

export const EVALUATE_TWIN = 'bench-evaluate-static.json';
export const EVALUATION_TWIN = 'bench-evaluation-static.json';

/** The POST /api/v1/ocv/evaluate body of operation 2: 10,000 readings of the NMC bench cell. */
export function evaluateBody(): string {
	const readings = syntheticReadings(10_000, 2).map(({ ocv_v, temperature_c }) => ({ ocv_v, temperature_c }));
	return JSON.stringify({ chemistry: 'NMC', declared_soc: 0.3, readings });
}

export const bearer = (token: string) => ({ authorization: `Bearer ${token}` });

/** Write the twins of both HTTP operations; an endpoint that does not answer 200 gets none. */
export async function writeStaticTwins(appUrl: string, buildDir: string, token: string, sampleLotId: string): Promise<void> {
	const answers = [
		[EVALUATE_TWIN, fetch(`${appUrl}/api/v1/ocv/evaluate`, { method: 'POST', body: evaluateBody(), headers: { ...bearer(token), 'content-type': 'application/json' } })],
		[EVALUATION_TWIN, fetch(`${appUrl}/api/v1/lots/${sampleLotId}/evaluation`, { headers: bearer(token) })]
	] as const;
	for (const [name, pending] of answers) {
		const response = await pending.catch(() => null);
		if (response?.status === 200) writeFileSync(`${buildDir}/client/${name}`, Buffer.from(await response.arrayBuffer()));
	}
}

/** Fetch a twin and make sure the static handler (not the app's sign-in redirect) answered it. */
export async function checkTwin(url: string, expectedBytes: number): Promise<void> {
	const response = await fetch(url, { redirect: 'manual' });
	const bytes = (await response.arrayBuffer()).byteLength;
	if (response.status !== 200) throw new Error(`static twin ${url} answered ${response.status}`);
	if (Math.abs(bytes - expectedBytes) > expectedBytes * 0.01) throw new Error(`static twin has ${bytes} bytes, the API answered ${expectedBytes}`);
}
