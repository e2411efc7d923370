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
	/** A received lot whose 2,000 readings are stored (evaluate-lot-2000). */
	bigLotId: string;
	/** A received lot with a full ISO 2859-1 sample of 200 readings (evaluation-api-load). */
	sampleLotId: string;
}
