import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		adapter: adapter({ out: 'build' }),
		// The origin check lives in hooks.server.ts, which exempts bearer-token API calls
		// (a browser never attaches those by itself, so they cannot be forged cross-site).
		csrf: { trustedOrigins: ['*'] }
	}
};

export default config;
