import type { Config } from 'tailwindcss';

/** Stillpoint's palette: a calm slate ground, one teal accent, amber for cautions. */
export default {
	content: ['./src/**/*.{html,svelte,ts}'],
	darkMode: 'class',
	theme: {
		extend: {
			fontFamily: {
				sans: ['"IBM Plex Sans"', 'system-ui', 'sans-serif'],
				mono: ['"IBM Plex Mono"', 'ui-monospace', 'monospace']
			},
			colors: {
				accent: {
					50: '#effaf8',
					100: '#d7f2ee',
					300: '#7fd0c4',
					500: '#2a9d8f',
					600: '#1f7f74',
					700: '#1b655d',
					900: '#12403b'
				},
				caution: { 100: '#fdf0d5', 500: '#d99a1e', 800: '#7a520c' }
			}
		}
	}
} satisfies Config;
