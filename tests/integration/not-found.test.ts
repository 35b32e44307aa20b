// An address with no page behind it is the visitor's slip: a 404 that says so, never "Internal Error"
// (which would send a crew lead who mistyped an address to the owner with a fault report).
import { describe, expect, it } from 'vitest';
import { demo } from '../helpers/env';
import { html, signedIn } from '../helpers/http';

describe('an address with no page', () => {
	it('answers 404 saying there is no page there, to a signed-in member', async () => {
		const crew = await signedIn(demo.crew, demo.password);
		const res = await crew.get('/week');
		expect(res.status).toBe(404);
		const text = await html(res);
		expect(text).toContain('There is no page at this address.');
		expect(text).not.toContain('Internal Error');
	});

	it('answers an unknown API address in JSON', async () => {
		const crew = await signedIn(demo.crew, demo.password);
		const res = await crew.get('/api/no-such-thing');
		expect(res.status).toBe(404);
		expect(res.headers.get('content-type')).toMatch(/application\/json/);
		expect((await res.json()).message).toBe('There is no API route at this address.');
	});
});
