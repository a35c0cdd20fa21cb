/**
 * One file to the intake API with upload progress. fetch() cannot report upload progress, so
 * this is the one place the lab uses XMLHttpRequest.
 */
export interface UploadAnswer {
	status: number;
	body: Record<string, unknown> | null;
}

export function uploadFile(url: string, file: File, onProgress: (fraction: number) => void): Promise<UploadAnswer> {
	return new Promise((resolve, reject) => {
		const xhr = new XMLHttpRequest();
		xhr.open('POST', url);
		xhr.setRequestHeader('accept', 'application/json');
		xhr.upload.addEventListener('progress', (event) => {
			if (event.lengthComputable) onProgress(event.loaded / event.total);
		});
		xhr.addEventListener('load', () => {
			let body: Record<string, unknown> | null = null;
			try {
				body = JSON.parse(xhr.responseText);
			} catch {
				body = null;
			}
			resolve({ status: xhr.status, body });
		});
		xhr.addEventListener('error', () => reject(new Error('The connection failed during the upload')));
		xhr.addEventListener('abort', () => reject(new Error('The upload was stopped')));
		const form = new FormData();
		form.append('file', file, file.name);
		xhr.send(form);
	});
}
