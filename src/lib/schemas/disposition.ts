/**
 * Material dispositions a quality manager records for a lot in review: what happens to the units
 * and what the supplier is asked to do. Relative imports only: drizzle-kit reads this file.
 */
export const MATERIAL_DISPOSITIONS = ['release', 'use_as_is', 'sort_rework', 'return_to_supplier', 'scrap'] as const;
export type MaterialDisposition = (typeof MATERIAL_DISPOSITIONS)[number];

interface DispositionInfo {
	/** Label in the review form and on pages. */
	label: string;
	/** One line under the label, so the choice is clear without a manual. */
	hint: string;
	/** The signed decision behind it: the lot ends accepted (released) or rejected (not used as delivered). */
	decision: 'accept' | 'reject';
	/** What the supplier is asked to do; empty when nothing is asked (then no due date either). */
	asks: string[];
}

export const DISPOSITION: Record<MaterialDisposition, DispositionInfo> = {
	release: {
		label: 'Release',
		hint: 'The lot is fit for use as delivered.',
		decision: 'accept',
		asks: []
	},
	use_as_is: {
		label: 'Use as is under a deviation',
		hint: 'The lot does not meet the requirement but is used; the supplier must prevent a repeat.',
		decision: 'accept',
		asks: [
			'Confirm in the portal that you have received this deviation.',
			'Send a corrective-action report (for example an 8D) so the finding does not recur.'
		]
	},
	sort_rework: {
		label: 'Sort or rework at the supplier’s cost',
		hint: 'Nonconforming units are sorted out or reworked; the supplier pays.',
		decision: 'reject',
		asks: [
			'Agree with our buyer who sorts or reworks the lot, where and when; the cost is yours.',
			'Send a corrective-action report (for example an 8D) through the portal.'
		]
	},
	return_to_supplier: {
		label: 'Return to supplier',
		hint: 'The whole lot goes back to the supplier.',
		decision: 'reject',
		asks: [
			'Arrange the return shipment with our buyer (collection date and the dangerous-goods shipping papers).',
			'Send a corrective-action report (for example an 8D) through the portal.'
		]
	},
	scrap: {
		label: 'Scrap',
		hint: 'The units are disposed of here, through a licensed recycler.',
		decision: 'reject',
		asks: [
			'Issue a credit note for the scrapped lot to our buyer.',
			'Send a corrective-action report (for example an 8D) through the portal.'
		]
	}
};

/** Dispositions a safety finding allows: the units may not be used, so only return or scrap. */
export const SAFETY_DISPOSITIONS: readonly MaterialDisposition[] = ['return_to_supplier', 'scrap'];

export const asksSupplier = (d: MaterialDisposition) => DISPOSITION[d].asks.length > 0;
