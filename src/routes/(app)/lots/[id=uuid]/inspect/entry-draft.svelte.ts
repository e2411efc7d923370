// The entry row's text as typed, shared by the grid (which edits it) and the page (whose live
// evaluation and plots include the row while it is typed).
import { evaluable, type BenchReading } from './live-evaluation';

/** A saved reading brought back by Ctrl+Z: saving the entry row corrects it (reason "undo"). */
export interface UndoTarget {
	id: number;
	client_key: string;
	serial: string;
}

/** A number typed at the bench: blank is not a number, a decimal comma is accepted. */
export const numberFromField = (text: string) => (text.trim() === '' ? Number.NaN : Number(text.trim().replace(',', '.')));

export class EntryDraft {
	serial = $state('');
	ocv = $state('');
	temperature = $state('');
	resistance = $state('');
	undoing = $state<UndoTarget | null>(null);

	/** The row as a reading the cores can evaluate, or null while it is incomplete. */
	reading(now: string): BenchReading | null {
		const ocv = numberFromField(this.ocv);
		const temperature = numberFromField(this.temperature);
		if (this.serial.trim() === '' || !evaluable(ocv, temperature)) return null;
		return { serial: this.serial.trim(), ocv_v: ocv, temperature_c: temperature, measured_at: now };
	}

	/** Clear what identifies one unit; the bench temperature stays for the next. */
	clearUnit(): void {
		this.serial = '';
		this.ocv = '';
		this.resistance = '';
		this.undoing = null;
	}
}
