// Multipart upload with progress (fetch has no upload progress in browsers; XMLHttpRequest does).
export interface UploadAnswer {
	status: number;
	// eslint-disable-next-line @typescript-eslint/no-explicit-any -- the JSON answer of whichever endpoint was called; callers narrow it
	body: any;
}

export function uploadWithProgress(url: string, form: FormData, onProgress: (fraction: number) => void): Promise<UploadAnswer> {
	return new Promise((resolve, reject) => {
		const xhr = new XMLHttpRequest();
		xhr.open('POST', url);
		xhr.responseType = 'json';
		xhr.upload.onprogress = (e) => {
			if (e.lengthComputable) onProgress(e.loaded / e.total);
		};
		xhr.onload = () => resolve({ status: xhr.status, body: xhr.response });
		xhr.onerror = () => reject(new Error('network'));
		xhr.send(form);
	});
}
