import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		adapter: adapter({ out: 'build' }),
		// Same-origin form posts only; the API uses JSON bodies and its own checks.
		csrf: { trustedOrigins: [] }
	}
};

export default config;
