// Furrowcast's own theme: named for the farm. Loaded by src/app.css with @config.
/** @type {import('tailwindcss').Config} */
export default {
	content: ['./src/**/*.{html,js,svelte,ts}'],
	theme: {
		extend: {
			fontFamily: {
				sans: ['Manrope', 'ui-sans-serif', 'system-ui', 'sans-serif']
			},
			colors: {
				// Warm stone neutrals.
				loam: {
					50: '#f8f6f3',
					100: '#efebe5',
					200: '#ddd5ca',
					300: '#c4b8a8',
					400: '#a39482',
					500: '#857562',
					600: '#6b5d4d',
					700: '#54493d',
					800: '#3b342c',
					900: '#26221d'
				},
				// Deep leaf green: primary actions.
				sprout: {
					50: '#eff7f0',
					100: '#d7ecda',
					200: '#add8b5',
					300: '#7cbd88',
					400: '#4f9e5e',
					500: '#33803f',
					600: '#256732',
					700: '#1e5229',
					800: '#183f21',
					900: '#112d18'
				},
				// Amber: warnings.
				squash: {
					50: '#fff8eb',
					100: '#feecc7',
					200: '#fdd68a',
					300: '#fbbc4d',
					400: '#f59f1f',
					500: '#d97f0b',
					600: '#b05f07',
					700: '#87470b',
					800: '#6b390f'
				},
				// Deep red: conflicts and errors.
				beet: {
					50: '#fdf0f2',
					100: '#fadde2',
					200: '#f3b5c0',
					300: '#e98096',
					400: '#d94f6d',
					500: '#be2f51',
					600: '#9c2241',
					700: '#7d1c36',
					800: '#5e162a'
				},
				// Cool blue: frost.
				frost: {
					50: '#eff6fb',
					100: '#d9eaf5',
					200: '#b2d4ea',
					300: '#80b7da',
					400: '#4f96c6',
					500: '#2f78ab',
					600: '#225f8b',
					700: '#1c4c70'
				},
				// Crop families: the Okabe-Ito colour-blind-safe palette (Okabe & Ito, 2008).
				family: {
					orange: '#E69F00',
					sky: '#56B4E9',
					green: '#009E73',
					yellow: '#F0E442',
					blue: '#0072B2',
					vermillion: '#D55E00',
					purple: '#CC79A7',
					black: '#000000'
				}
			}
		}
	}
};
