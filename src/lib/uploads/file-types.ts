/**
 * The file types Restvolt stores or reads, with the MIME type it serves them as, the file-name
 * extensions that belong to each, and the MIME types a browser or client may declare for them.
 */
export const FILE_TYPES = {
	pdf: { label: 'PDF', mime: 'application/pdf', extensions: ['pdf'], declared: ['application/pdf', 'application/x-pdf'] },
	png: { label: 'PNG', mime: 'image/png', extensions: ['png'], declared: ['image/png'] },
	jpeg: { label: 'JPEG', mime: 'image/jpeg', extensions: ['jpg', 'jpeg'], declared: ['image/jpeg', 'image/jpg', 'image/pjpeg'] },
	xlsx: {
		label: 'XLSX',
		mime: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
		extensions: ['xlsx'],
		declared: ['application/vnd.openxmlformats-officedocument.spreadsheetml.sheet', 'application/zip', 'application/x-zip-compressed']
	},
	// Windows registers .csv to Excel, so browsers there declare CSV as application/vnd.ms-excel.
	csv: {
		label: 'CSV',
		mime: 'text/csv',
		extensions: ['csv'],
		declared: ['text/csv', 'text/plain', 'application/csv', 'text/comma-separated-values', 'application/vnd.ms-excel']
	},
	txt: { label: 'text', mime: 'text/plain', extensions: ['txt'], declared: ['text/plain'] }
} as const;

export type FileType = keyof typeof FILE_TYPES;

/** Declared types that say nothing about the content (a client that did not know). */
export const GENERIC_DECLARED = ['', 'application/octet-stream', 'binary/octet-stream', 'application/unknown'];

/**
 * Extensions that name a type we never store. A name with one of these is a claim about the
 * content that contradicts what we found, so it is refused rather than quietly renamed.
 */
export const FOREIGN_EXTENSIONS = [
	'html',
	'htm',
	'xhtml',
	'shtml',
	'svg',
	'svgz',
	'xml',
	'xsl',
	'js',
	'mjs',
	'cjs',
	'css',
	'php',
	'asp',
	'aspx',
	'jsp',
	'exe',
	'dll',
	'msi',
	'bat',
	'cmd',
	'com',
	'scr',
	'ps1',
	'sh',
	'vbs',
	'jar',
	'apk',
	'app',
	'zip',
	'7z',
	'rar',
	'gz',
	'tar',
	'docx',
	'docm',
	'xlsm',
	'xls',
	'doc',
	'pptx',
	'ppt',
	'odt',
	'ods',
	'rtf',
	'gif',
	'webp',
	'bmp',
	'tif',
	'tiff'
];

/** The file type an extension belongs to, among those given. */
export function typeOfExtension(ext: string, among: readonly FileType[]): FileType | null {
	return among.find((t) => (FILE_TYPES[t].extensions as readonly string[]).includes(ext)) ?? null;
}

/** Labels joined for a sentence: "PDF, PNG or JPEG". */
export function typeList(types: readonly FileType[]): string {
	const labels = types.map((t) => FILE_TYPES[t].label);
	return labels.length < 2 ? labels.join('') : `${labels.slice(0, -1).join(', ')} or ${labels.at(-1)}`;
}
