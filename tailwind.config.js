/** @type {import('tailwindcss').Config} */
export default {
	content: ['./src/**/*.{html,js,svelte,ts}'],
	theme: {
		extend: {
			fontFamily: { sans: ['"Inter Variable"', 'system-ui', 'sans-serif'] },
			colors: {
				// Our own palette: loam browns and field greens, high contrast for a cab screen.
				loam: { 50: '#faf7f2', 100: '#f1eadf', 200: '#e0d2bd', 500: '#8a6a45', 700: '#5b4326', 900: '#2e2113' },
				sprout: { 50: '#f0f8ee', 100: '#d9efd3', 500: '#3f8a35', 600: '#2f7227', 700: '#245a1e', 900: '#13310f' },
				husk: { 400: '#e0b43a', 500: '#c99a1c' }
			}
		}
	},
	plugins: []
};
