import adapter from '@sveltejs/adapter-static';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';
import { cspDirectives, teamServerOrigin } from './src/lib/security/content-security-policy.js';

/** @type {import('@sveltejs/kit').Config} */
const config = {
  preprocess: vitePreprocess(),
  kit: {
    adapter: adapter({ pages: 'build', assets: 'build', fallback: 'index.html', strict: true }),
    // The Workbox worker is generated after the build and registered by the page itself
    // (src/lib/ui/update-watch.ts), so that an update waits for the user's consent.
    serviceWorker: { register: false },
    version: { pollInterval: 0 },
    // Content-Security-Policy as a <meta> tag in the built page; SvelteKit adds the hash of its own
    // inline start-up script to script-src (no other inline script runs). `kinnote serve` sends the
    // same policy as a header. frame-ancestors only counts in the header (browsers ignore it in a tag).
    csp: { mode: 'hash', directives: cspDirectives(teamServerOrigin(process.env.KINNOTE_TEAM_SERVER_ORIGIN)) },
  },
};

export default config;
