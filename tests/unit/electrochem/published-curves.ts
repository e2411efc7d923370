// Full-cell OCV curves from open-literature electrode parameterisations, written out as the
// papers give them (coefficients from memory, checked against the papers' plotted ranges:
// 2.5–4.2 V for the LG M50, 2.8–4.15 V for the LCO cell). OCV(z) = U₊(y(z)) − U₋(x(z)) with the
// stoichiometries moving linearly between the papers' 0 % and 100 % SOC values.
const tanh = Math.tanh;

/**
 * C.-H. Chen et al., "Development of experimental techniques for parameterization of
 * multi-scale lithium-ion battery models", J. Electrochem. Soc. 167 (2020) 080534:
 * LG M50 21700, NMC 811 positive, graphite–SiOx negative (from memory).
 */
export function chen2020Nmc811(z: number): number {
	const x = 0.0279 + z * (0.9014 - 0.0279);
	const y = 0.9084 + z * (0.2661 - 0.9084);
	const un =
		1.9793 * Math.exp(-39.3631 * x) +
		0.2482 -
		0.0909 * tanh(29.8538 * (x - 0.1234)) -
		0.04478 * tanh(14.9159 * (x - 0.2769)) -
		0.0205 * tanh(30.4444 * (x - 0.6103));
	const up =
		-0.809 * y +
		4.4875 -
		0.0428 * tanh(18.5138 * (y - 0.5542)) -
		17.7326 * tanh(15.789 * (y - 0.3117)) +
		17.5842 * tanh(15.9308 * (y - 0.312));
	return up - un;
}

/**
 * P. Ramadass et al., "Development of first principles capacity fade model for Li-ion cells",
 * J. Electrochem. Soc. 151 (2004) A196: LiCoO₂ positive and carbon negative (from memory);
 * stoichiometry windows y 0.955→0.50 and x 0.01→0.78 (from memory).
 */
export function ramadass2004Lco(z: number): number {
	const y = 0.955 + z * (0.5 - 0.955);
	const x = 0.01 + z * (0.78 - 0.01);
	const up =
		(-4.656 + 88.669 * y ** 2 - 401.119 * y ** 4 + 342.909 * y ** 6 - 462.471 * y ** 8 + 433.434 * y ** 10) /
		(-1 + 18.933 * y ** 2 - 79.532 * y ** 4 + 37.311 * y ** 6 - 73.083 * y ** 8 + 95.96 * y ** 10);
	const un =
		0.7222 +
		0.1387 * x +
		0.029 * x ** 0.5 -
		0.0172 / x +
		0.0019 / x ** 1.5 +
		0.2808 * Math.exp(0.9 - 15 * x) -
		0.7984 * Math.exp(0.4465 * x - 0.4108);
	return up - un;
}

/** n evenly spaced points from 0 to 1, as a datasheet table gives them. */
export const sampled = (f: (z: number) => number, n = 21) =>
	Array.from({ length: n }, (_, i) => ({ soc: i / (n - 1), ocv_v: f(i / (n - 1)) }));
