// A small HTTP client for the running test server: keeps the session cookie like a browser
// and posts forms the way a browser without JavaScript does (with the Origin header that
// SvelteKit's CSRF check expects).
import { baseUrl } from './env';

export class Client {
	cookies = new Map<string, string>();
	lastSetCookie: string[] = [];

	private header(): string {
		return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
	}

	private remember(res: Response): void {
		this.lastSetCookie = res.headers.getSetCookie();
		for (const c of this.lastSetCookie) {
			const [pair] = c.split(';');
			const i = pair.indexOf('=');
			const name = pair.slice(0, i);
			const value = pair.slice(i + 1);
			if (value === '' || /max-age=0/i.test(c)) this.cookies.delete(name);
			else this.cookies.set(name, value);
		}
	}

	async request(path: string, init: RequestInit = {}): Promise<Response> {
		const headers = new Headers(init.headers);
		if (this.cookies.size) headers.set('cookie', this.header());
		const res = await fetch(baseUrl() + path, { ...init, headers, redirect: 'manual' });
		this.remember(res);
		return res;
	}

	/** GET like a browser would: HTML for pages, JSON for the API. */
	get(path: string, init: RequestInit = {}): Promise<Response> {
		const headers = new Headers(init.headers);
		if (!headers.has('accept')) headers.set('accept', path.startsWith('/api/') ? 'application/json' : 'text/html');
		return this.request(path, { ...init, headers });
	}

	/** POST a form to a page action ('/signin' or '/settings?/farm'). */
	postForm(path: string, fields: Record<string, string | number>): Promise<Response> {
		const body = new URLSearchParams(Object.entries(fields).map(([k, v]) => [k, String(v)]));
		return this.request(path, {
			method: 'POST',
			body,
			headers: { origin: baseUrl(), accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' }
		});
	}

	json(path: string, method: string, payload?: unknown): Promise<Response> {
		return this.request(path, {
			method,
			body: payload === undefined ? undefined : JSON.stringify(payload),
			headers: { origin: baseUrl(), 'content-type': 'application/json', accept: 'application/json' }
		});
	}
}

/** A client signed in as the given account; throws when the sign-in is refused. */
export async function signedIn(email: string, password: string): Promise<Client> {
	const client = new Client();
	const res = await client.postForm('/signin', { email, password });
	if (res.status !== 303) throw new Error(`sign-in as ${email} answered ${res.status}`);
	return client;
}

/** A page's HTML with the character references decoded, to compare against plain messages. */
export async function html(res: Response): Promise<string> {
	return (await res.text()).replace(
		/&(lt|gt|amp|quot|#39|#x27);/g,
		(_, e: string) => ({ lt: '<', gt: '>', amp: '&', quot: '"', '#39': "'", '#x27': "'" })[e] ?? ''
	);
}
