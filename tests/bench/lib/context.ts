import type { BenchApp } from './app';
import type { BenchPart } from './data';

/** What every operation gets: the running app, the database and the demo part used for bench lots. */
export interface BenchContext {
	app: BenchApp;
	databaseUrl: string;
	pgBin: string;
	scratch: string;
	part: BenchPart;
	/** Bearer token of the seeded inspector. */
	token: string;
	/** A received lot whose 2,000 readings are stored (operation 1). */
	bigLotId: string;
	/** A received lot with a full ISO 2859-1 sample of 200 readings (operations 4 and 6). */
	sampleLotId: string;
}

/** A file in the build's client folder, which adapter-node serves as a static asset (see static-twins.ts). */
export function staticPath(ctx: BenchContext, name: string): { file: string; url: string } {
	return { file: `${ctx.app.buildDir}/client/${name}`, url: `${ctx.app.url}/${name}` };
}
