import type { Config } from 'tailwindcss';

// Restvolt's own palette: deep "electrolyte" teal for actions, warm paper background,
// and status colours that always travel with a word and a shape (never colour alone).
export default {
	content: ['./src/**/*.{html,js,svelte,ts}'],
	theme: {
		extend: {
			colors: {
				paper: '#f6f4ef',
				panel: '#ffffff',
				ink: { DEFAULT: '#1c2430', soft: '#3d4756', muted: '#667085' },
				line: '#d9d4c7',
				volt: { 50: '#eefaf8', 100: '#d3f2ed', 500: '#14a08f', 600: '#0f766e', 700: '#0d5f59', 900: '#0a3b38' },
				amp: { 100: '#fdf0d5', 500: '#e29a1a', 700: '#b54708' },
				status: {
					accept: '#2e7d32',
					hold: '#b54708',
					reject: '#b42318',
					pending: '#475467',
					info: '#1d5fa8'
				}
			},
			fontFamily: {
				sans: ['"Roboto Flex"', 'system-ui', 'sans-serif'],
				mono: ['ui-monospace', 'SFMono-Regular', 'Menlo', 'monospace']
			},
			fontSize: {
				xs: ['0.75rem', '1rem'],
				sm: ['0.875rem', '1.25rem'],
				base: ['1rem', '1.5rem'],
				lg: ['1.125rem', '1.6rem'],
				xl: ['1.375rem', '1.8rem'],
				'2xl': ['1.75rem', '2.2rem'],
				'3xl': ['2.25rem', '2.6rem']
			},
			borderRadius: { card: '0.6rem' }
		}
	}
} satisfies Config;
