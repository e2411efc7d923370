// Shared SVG charts. They render on the server, scale with their container (viewBox) and
// never rely on colour alone: every series has a marker shape or pattern and a legend word.
// SOC values are fractions 0–1 throughout; voltages are per cell in V.
export { default as OcvStripChart } from './OcvStripChart.svelte';
export { default as SocIntervalChart } from './SocIntervalChart.svelte';
export { default as ModelCurveChart } from './ModelCurveChart.svelte';
export { default as TrendChart } from './TrendChart.svelte';
export type { OcvUnit } from './ocv-strip';
export type { SocUnit } from './soc-rows';
