import forms from '@tailwindcss/forms';
import type { Config } from 'tailwindcss';

// Beamwarden's look: warm paper, dark ink, one accent (a deep lagoon blue-green).
// Status never relies on colour alone: every state is a word plus an icon.
export default {
	content: ['./src/**/*.{html,js,svelte,ts}'],
	theme: {
		extend: {
			colors: {
				paper: { DEFAULT: '#f7f5f0', raised: '#ffffff', sunk: '#ece8df' },
				ink: { DEFAULT: '#1d2327', soft: '#3f4a50', faint: '#5f6b71', line: '#cfd6d9' },
				accent: {
					50: '#eaf5f4',
					100: '#cde8e6',
					500: '#1b7f7a',
					600: '#146a66',
					700: '#0f5552',
					800: '#0b403e'
				},
				state: { alert: '#9b1c1c', alertBg: '#fdecec', caution: '#7a4a00', cautionBg: '#fdf3dc', calm: '#1f5130', calmBg: '#e7f3ea' }
			},
			fontFamily: {
				sans: ['"Atkinson Hyperlegible"', 'ui-sans-serif', 'system-ui', 'sans-serif'],
				mono: ['ui-monospace', 'SFMono-Regular', 'Menlo', 'monospace']
			},
			spacing: { gutter: '1.5rem', field: '2.75rem', rail: '15rem' },
			borderRadius: { panel: '0.625rem' },
			maxWidth: { form: '40rem', page: '80rem' }
		}
	},
	plugins: [forms]
} satisfies Config;
