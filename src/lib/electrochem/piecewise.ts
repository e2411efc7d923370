// One piecewise-linear table over z: [z, value] pairs in increasing z, constant beyond the ends.
export type PiecewiseTable = ReadonlyArray<readonly [number, number]>;

export function piecewiseAt(table: PiecewiseTable, z: number): number {
	const n = table.length;
	if (n === 0) return 0;
	if (z <= table[0][0]) return table[0][1];
	if (z >= table[n - 1][0]) return table[n - 1][1];
	let i = 1;
	while (table[i][0] < z) i++;
	const [z0, v0] = table[i - 1];
	const [z1, v1] = table[i];
	return v0 + ((v1 - v0) * (z - z0)) / (z1 - z0);
}
