import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		// Separate build folders let several checkouts' test runs build side by side.
		adapter: adapter({ out: process.env.FC_BUILD_DIR ?? 'build' }),
		outDir: process.env.FC_KIT_DIR ?? '.svelte-kit',
		// Forms post from our own origin only; SvelteKit's CSRF check stays on.
		csrf: { trustedOrigins: [] },
		// Content-Security-Policy on every page: SvelteKit adds a nonce to its own inline start-up
		// script (hashes on prerendered pages), so no other script runs. Styles allow 'unsafe-inline'
		// because components set style attributes (grid column widths, chart geometry). Non-page
		// responses (JSON, files) get `default-src 'none'; frame-ancestors 'none'` from scripts/serve.js.
		csp: {
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self', 'data:'],
				// Vite inlines the smallest font files as data: URLs.
				'font-src': ['self', 'data:'],
				'connect-src': ['self'],
				'object-src': ['none'],
				'base-uri': ['self'],
				'form-action': ['self'],
				'frame-ancestors': ['none']
			}
		}
	}
};

export default config;
