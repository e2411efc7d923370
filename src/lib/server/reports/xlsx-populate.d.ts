/** The small part of xlsx-populate 1.21 that Restvolt uses; the package ships no types. */
declare module 'xlsx-populate' {
	type CellValue = string | number | boolean | Date | null | undefined;

	interface Cell {
		value(): CellValue;
		value(value: CellValue): Cell;
		style(name: string, value: unknown): Cell;
		style(styles: Record<string, unknown>): Cell;
	}

	interface Range {
		value(values: CellValue[][]): Range;
		value(): CellValue[][];
		style(styles: Record<string, unknown>): Range;
	}

	interface Column {
		width(width: number): Column;
	}

	interface Sheet {
		name(): string;
		name(name: string): Sheet;
		cell(address: string): Cell;
		cell(row: number, column: number): Cell;
		range(address: string): Range;
		range(startRow: number, startColumn: number, endRow: number, endColumn: number): Range;
		column(nameOrNumber: string | number): Column;
		usedRange(): Range | undefined;
		freezePanes(column: number, row: number): Sheet;
	}

	interface Workbook {
		sheet(nameOrIndex: string | number): Sheet | undefined;
		sheets(): Sheet[];
		addSheet(name: string): Sheet;
		deleteSheet(nameOrIndex: string | number): Workbook;
		outputAsync(): Promise<Buffer>;
	}

	const XlsxPopulate: {
		fromBlankAsync(): Promise<Workbook>;
		fromDataAsync(data: Buffer | Uint8Array | ArrayBuffer): Promise<Workbook>;
	};
	export default XlsxPopulate;
	export type { Workbook, Sheet, Cell, Range };
}
