import type { Config } from 'tailwindcss';
import defaultTheme from 'tailwindcss/defaultTheme';

/**
 * Fractile's palette: a cool concrete grey for surfaces, a deep teal for the brand and
 * actions, and the Okabe–Ito colour-blind-safe set for charts and verdicts (Okabe & Ito,
 * "Color Universal Design", 2008). Verdicts never rely on colour alone: each carries a word
 * and a mark as well.
 */
export default {
	content: ['./src/**/*.{html,js,svelte,ts}'],
	theme: {
		extend: {
			fontFamily: {
				sans: ['Inter', ...defaultTheme.fontFamily.sans]
			},
			colors: {
				concrete: {
					50: '#f6f7f7',
					100: '#eceeee',
					200: '#d7dbdc',
					300: '#b6bdbf',
					400: '#8e989b',
					500: '#6f7a7e',
					600: '#586266',
					700: '#474f53',
					800: '#3b4245',
					900: '#24292b'
				},
				brand: {
					50: '#effaf8',
					100: '#d6f1ec',
					200: '#ade2d9',
					300: '#7ccbc0',
					400: '#4daea3',
					500: '#329389',
					600: '#25766f',
					700: '#205f5a',
					800: '#1d4c49',
					900: '#1b403e'
				},
				verdict: {
					pass: '#009e73',
					fail: '#d55e00',
					unsure: '#e69f00',
					info: '#0072b2'
				}
			}
		}
	},
	plugins: []
} satisfies Config;
