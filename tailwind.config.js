/** @type {import('tailwindcss').Config} */
export default {
	content: ['./src/**/*.{html,js,svelte,ts}'],
	theme: {
		extend: {
			fontFamily: { sans: ['"Inter Variable"', 'system-ui', 'sans-serif'] },
			colors: {
				// Our own palette: slate ink for chrome and actions, a clay accent, warm loam neutrals.
				// Chrome stays neutral so the crop colours on the maps are the only strong hues.
				loam: { 50: '#faf7f2', 100: '#f1eadf', 200: '#e0d2bd', 500: '#8a6a45', 700: '#5b4326', 900: '#2e2113' },
				ink: { 50: '#f2f5f8', 100: '#dfe6ee', 200: '#c3cfdc', 500: '#52657a', 600: '#3d5064', 700: '#2f4257', 900: '#1a2634' },
				clay: { 50: '#fbf1ec', 300: '#e3a487', 400: '#d9825c', 500: '#b4532a', 700: '#8a3b1c' }
			}
		}
	},
	plugins: []
};
