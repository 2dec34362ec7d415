import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
export default {
	preprocess: vitePreprocess(),
	kit: {
		adapter: adapter(),
		csp: {
			// Nonces on SvelteKit's own inline script and style; nothing else inline may run.
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				'style-src': ['self'],
				// Leaflet and Svelte's style: bindings position elements through style attributes; an
				// attribute cannot run script or load anything, so only attributes are let through.
				'style-src-attr': ['unsafe-inline'],
				// The map tile host is known only at run time: hooks.server.ts adds it to img-src.
				'img-src': ['self', 'data:', 'blob:'],
				'font-src': ['self'],
				'connect-src': ['self'],
				'object-src': ['none'],
				'base-uri': ['self'],
				'frame-ancestors': ['none'],
				'form-action': ['self']
			}
		}
	}
};
