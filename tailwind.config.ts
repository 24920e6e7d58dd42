import type { Config } from 'tailwindcss';

// Furrowcast's own palette: loam browns, clover greens and a straw accent on warm neutrals.
export default {
	content: ['./src/**/*.{html,js,svelte,ts}'],
	theme: {
		extend: {
			colors: {
				loam: {
					50: '#f7f3ef',
					100: '#ece2d8',
					200: '#d9c4b0',
					300: '#bf9f82',
					400: '#a27b5b',
					500: '#856046',
					600: '#6b4b37',
					700: '#553b2d',
					800: '#3f2c22',
					900: '#2a1d17'
				},
				clover: {
					50: '#f1f7f1',
					100: '#dcecdc',
					200: '#b8d8b9',
					300: '#8bbd8e',
					400: '#5f9f64',
					500: '#43834a',
					600: '#33683a',
					700: '#29522f',
					800: '#213f26',
					900: '#182d1c'
				},
				straw: {
					100: '#fbf3d9',
					200: '#f5e3a6',
					300: '#eccd6b',
					400: '#ddb43f',
					500: '#c0962a'
				},
				hearth: {
					50: '#fbfaf7',
					100: '#f4f1ea',
					200: '#e7e2d7',
					300: '#cfc8ba',
					500: '#8a8275',
					700: '#51493f',
					900: '#25211c'
				},
				loss: {
					100: '#fbe4e1',
					600: '#b3261e',
					700: '#8c1d17'
				}
			},
			fontFamily: {
				sans: ['"Public Sans"', 'system-ui', 'sans-serif']
			}
		}
	}
} satisfies Config;
