import adapter from '@sveltejs/adapter-static';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
  preprocess: vitePreprocess(),
  kit: {
    adapter: adapter({ pages: 'build', assets: 'build', fallback: 'index.html', strict: true }),
    // The Workbox worker is generated after the build and registered by the page itself
    // (src/lib/ui/update-watch.ts), so that an update waits for the user's consent.
    serviceWorker: { register: false },
    version: { pollInterval: 0 },
  },
};

export default config;
