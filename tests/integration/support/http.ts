/**
 * A small HTTP client for the test server with its own cookie jar. Redirects are never followed,
 * so tests see the 303s the guard and the form actions answer.
 */
import { baseURL } from './context';

export interface RequestOptions {
	/** Sent as JSON with Content-Type: application/json. */
	json?: unknown;
	/** Sent as application/x-www-form-urlencoded, like a form without JavaScript. */
	form?: Record<string, string>;
	/** Sent as multipart/form-data, like a browser's FormData upload. */
	multipart?: FormData;
	/** A raw body; pair it with `contentType`. */
	body?: string;
	contentType?: string;
	/** Defaults to JSON for /api/ paths and HTML for pages (a browser's navigation). */
	accept?: string;
	/** Leave the jar untouched (e.g. a sign-out in the access matrix must not end the shared session). */
	keepJar?: boolean;
}

export class HttpClient {
	private readonly jar = new Map<string, string>();

	constructor(readonly base: string = baseURL()) {}

	cookieHeader(): string {
		return [...this.jar].map(([name, value]) => `${name}=${value}`).join('; ');
	}

	hasCookies(): boolean {
		return this.jar.size > 0;
	}

	/** A copy with the same cookies, for requests whose Set-Cookie must not reach this jar. */
	clone(): HttpClient {
		const copy = new HttpClient(this.base);
		for (const [name, value] of this.jar) copy.jar.set(name, value);
		return copy;
	}

	async request(method: string, path: string, options: RequestOptions = {}): Promise<Response> {
		const headers: Record<string, string> = {
			// SvelteKit refuses cross-site form posts; a browser on the app's own page sends its origin.
			origin: this.base,
			accept: options.accept ?? (path.startsWith('/api/') ? 'application/json' : 'text/html')
		};
		let body: string | FormData | undefined;
		if (options.json !== undefined) {
			headers['content-type'] = 'application/json';
			body = JSON.stringify(options.json);
		} else if (options.form) {
			headers['content-type'] = 'application/x-www-form-urlencoded';
			body = new URLSearchParams(options.form).toString();
		} else if (options.multipart) {
			body = options.multipart; // fetch sets the multipart content type with its boundary
		} else if (options.body !== undefined) {
			body = options.body;
		}
		if (options.contentType) headers['content-type'] = options.contentType;
		if (this.jar.size) headers.cookie = this.cookieHeader();

		const response = await fetch(this.base + path, { method, headers, body, redirect: 'manual' });
		if (!options.keepJar) this.store(response.headers.getSetCookie());
		return response;
	}

	get(path: string, options?: RequestOptions) {
		return this.request('GET', path, options);
	}

	post(path: string, options?: RequestOptions) {
		return this.request('POST', path, options);
	}

	patch(path: string, options?: RequestOptions) {
		return this.request('PATCH', path, options);
	}

	/** GET a JSON API path and return the parsed body, failing loudly on any other status. */
	async getJson<T = Record<string, unknown>>(path: string): Promise<T> {
		const response = await this.get(path);
		const text = await response.text();
		if (response.status !== 200) throw new Error(`GET ${path} answered ${response.status}: ${text.slice(0, 300)}`);
		return JSON.parse(text) as T;
	}

	private store(setCookies: string[]): void {
		for (const line of setCookies) {
			const [pair, ...attributes] = line.split(';');
			const eq = pair.indexOf('=');
			const name = pair.slice(0, eq).trim();
			const value = pair.slice(eq + 1).trim();
			const expired = attributes.some((a) => {
				const [key, val = ''] = a.trim().split('=');
				if (key.toLowerCase() === 'max-age') return Number(val) <= 0;
				if (key.toLowerCase() === 'expires') return Date.parse(val) <= Date.now();
				return false;
			});
			if (expired || value === '') this.jar.delete(name);
			else this.jar.set(name, value);
		}
	}
}

/** The `{error, fields}` body every API error carries (src/lib/server/http.ts). */
export interface ApiError {
	error: string;
	fields?: Record<string, string[]>;
}

export async function readJson<T = unknown>(response: Response): Promise<T> {
	const text = await response.text();
	try {
		return JSON.parse(text) as T;
	} catch {
		throw new Error(`Expected JSON from ${response.url} (${response.status}), got: ${text.slice(0, 300)}`);
	}
}
