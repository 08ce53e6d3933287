import type { Config } from 'tailwindcss';

// Brothwright's own palette: "kelp" (deep sea-green ink), "malt" (warm grain accent),
// "oat" (warm neutrals) and plain-language status hues.
export default {
	content: ['./src/**/*.{html,svelte,ts}'],
	theme: {
		extend: {
			colors: {
				kelp: {
					50: '#eef6f4',
					100: '#d5e9e4',
					200: '#abd3ca',
					300: '#78b6a9',
					400: '#4a9486',
					500: '#2f786b',
					600: '#235f55',
					700: '#1d4c45',
					800: '#173c37',
					900: '#112c29',
					950: '#0a1c1a'
				},
				malt: {
					50: '#fdf7ec',
					100: '#f9e9cb',
					200: '#f2d193',
					300: '#e9b35a',
					400: '#de9632',
					500: '#c8791c',
					600: '#a65d16',
					700: '#834616',
					800: '#663817',
					900: '#4f2d15'
				},
				oat: {
					50: '#faf8f4',
					100: '#f3efe7',
					200: '#e6dfd2',
					300: '#d3c8b5',
					400: '#b3a58d',
					500: '#938570',
					600: '#766a59',
					700: '#5d5447',
					800: '#433d34',
					900: '#2b2722'
				},
				ok: { 50: '#eef8ee', 600: '#2e7d32', 800: '#1f5522' },
				caution: { 50: '#fff7e6', 600: '#b26a00', 800: '#7a4800' },
				halt: { 50: '#fdeeee', 600: '#b3261e', 800: '#7d1a15' }
			},
			fontFamily: {
				sans: ['Lexend', 'ui-sans-serif', 'system-ui', 'sans-serif'],
				mono: ['ui-monospace', 'SFMono-Regular', 'Menlo', 'monospace']
			},
			fontSize: {
				// A compact working scale: dense tables stay legible, headings stay calm.
				'2xs': ['0.6875rem', { lineHeight: '1rem' }],
				xs: ['0.75rem', { lineHeight: '1.1rem' }],
				sm: ['0.84rem', { lineHeight: '1.3rem' }],
				base: ['0.94rem', { lineHeight: '1.5rem' }],
				lg: ['1.08rem', { lineHeight: '1.6rem' }],
				xl: ['1.3rem', { lineHeight: '1.8rem' }],
				'2xl': ['1.62rem', { lineHeight: '2.1rem' }],
				'3xl': ['2.05rem', { lineHeight: '2.5rem' }]
			},
			spacing: {
				gutter: '1.25rem',
				rail: '15rem',
				touch: '3rem'
			},
			borderRadius: {
				card: '0.6rem'
			},
			boxShadow: {
				card: '0 1px 2px rgb(17 44 41 / 0.06), 0 2px 8px rgb(17 44 41 / 0.05)'
			}
		}
	}
} satisfies Config;
