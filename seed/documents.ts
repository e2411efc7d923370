/** Small invented PDF documents (CoC, UN 38.3 test summary, SDS) for the demo lots. */
import { PDFDocument, StandardFonts } from 'pdf-lib';

const TITLES = {
	coc: 'Certificate of Conformance',
	un38_3_summary: 'UN 38.3 Test Summary',
	sds: 'Safety Data Sheet'
} as const;
export type DemoDocumentKind = keyof typeof TITLES;

export async function demoDocument(kind: DemoDocumentKind, supplier: string, partNumber: string, po: string): Promise<Uint8Array> {
	const pdf = await PDFDocument.create();
	const page = pdf.addPage([595, 842]);
	const font = await pdf.embedFont(StandardFonts.Helvetica);
	const lines = [
		TITLES[kind],
		'',
		`Supplier: ${supplier}`,
		`Part: ${partNumber}`,
		`Purchase order: ${po}`,
		'',
		'Invented demonstration document for the Restvolt demo scenario.',
		'It certifies nothing and describes no real product.'
	];
	lines.forEach((text, i) => page.drawText(text, { x: 56, y: 780 - i * 22, size: i === 0 ? 20 : 12, font }));
	pdf.setTitle(`${TITLES[kind]} ${po}`);
	// A fixed date keeps the bytes (and so the sha256) the same on every seed run.
	pdf.setCreationDate(new Date('2026-01-01T00:00:00Z'));
	pdf.setModificationDate(new Date('2026-01-01T00:00:00Z'));
	return pdf.save();
}
