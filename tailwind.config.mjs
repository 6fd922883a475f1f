/** @type {import('tailwindcss').Config} */
export default {
	content: ['./src/**/*.{astro,html,js,jsx,ts,tsx}'],
	theme: {
		extend: {
			colors: {
				// Our own palette: deep "ink" blues for structure, a warm "copper" accent for action,
				// and plain signal colours for findings.
				ink: {
					50: '#f3f6f9',
					100: '#e3e9f0',
					200: '#c5d1de',
					300: '#9aaec4',
					400: '#6b86a5',
					500: '#4b6889',
					600: '#3a5270',
					700: '#2f425b',
					800: '#24334a',
					900: '#182335',
					950: '#0e1624',
				},
				copper: {
					50: '#fdf6ef',
					100: '#fae8d6',
					200: '#f3cca7',
					300: '#eaa86f',
					400: '#e0853f',
					500: '#d06a22',
					600: '#b35319',
					700: '#8f3f18',
					800: '#73341a',
					900: '#5e2c18',
				},
				signal: {
					ok: '#1f7a4d',
					note: '#2d6cb5',
					warning: '#b7791f',
					violation: '#b42318',
				},
			},
			fontFamily: {
				sans: ['"Noto Sans"', 'system-ui', 'sans-serif'],
			},
			fontSize: {
				// A compact type scale tuned for dense schedules and readable forms.
				xs: ['0.75rem', { lineHeight: '1.1rem' }],
				sm: ['0.875rem', { lineHeight: '1.3rem' }],
				base: ['1rem', { lineHeight: '1.55rem' }],
				lg: ['1.125rem', { lineHeight: '1.65rem' }],
				xl: ['1.3rem', { lineHeight: '1.8rem' }],
				'2xl': ['1.6rem', { lineHeight: '2.1rem' }],
				'3xl': ['2rem', { lineHeight: '2.4rem' }],
			},
		},
	},
	plugins: [],
};
