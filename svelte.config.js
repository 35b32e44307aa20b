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
		csrf: { trustedOrigins: [] }
	}
};

export default config;
