// The one Content-Security-Policy of Kinnote, read by svelte.config.js (the <meta> tag SvelteKit
// writes into the built page, with hashes of its own inline start-up script) and by `kinnote serve`
// (the same policy as a response header, where frame-ancestors also counts). Plain JavaScript so that
// svelte.config.js can import it without a TypeScript loader.

/**
 * The optional team server the page may talk to, from the environment at build and serve time
 * (KINNOTE_TEAM_SERVER_ORIGIN, e.g. https://kinnote.example.org); only an http(s) origin, nothing else.
 * @param {string | undefined} value
 * @returns {string | null}
 */
export function teamServerOrigin(value) {
  if (value === undefined || value.trim() === '') return null;
  let url;
  try {
    url = new URL(value.trim());
  } catch {
    throw new Error(`KINNOTE_TEAM_SERVER_ORIGIN "${value}" is not a URL`);
  }
  if (url.protocol !== 'https:' && url.protocol !== 'http:') throw new Error(`KINNOTE_TEAM_SERVER_ORIGIN must be http(s), not ${url.protocol}`);
  return url.origin;
}

/**
 * Directives in SvelteKit's form (keywords without quotes). No inline script and no eval anywhere;
 * no remote origin except the configured team server (connect-src only). Styles allow inline
 * attributes because Svelte templates and app.html set style attributes (no script runs from them).
 * @param {string | null} teamServer origin from teamServerOrigin, or null
 * @returns {Record<string, string[]>}
 */
export function cspDirectives(teamServer) {
  return {
    'default-src': ['self'],
    'script-src': ['self'],
    'style-src': ['self', 'unsafe-inline'],
    'img-src': ['self', 'data:', 'blob:'],
    'media-src': ['self', 'blob:'],
    'font-src': ['self'],
    'connect-src': teamServer ? ['self', teamServer] : ['self'],
    'worker-src': ['self'],
    'manifest-src': ['self'],
    'object-src': ['none'],
    'base-uri': ['self'],
    'form-action': ['self'],
    'frame-ancestors': ['none'],
  };
}

const KEYWORDS = new Set(['self', 'none', 'unsafe-inline', 'unsafe-eval', 'strict-dynamic', 'report-sample', 'wasm-unsafe-eval']);

/**
 * The policy as a header value; `extraScriptSources` adds the hashes SvelteKit put into the page's
 * meta tag, so header and tag allow the same start-up script.
 * @param {Record<string, string[]>} directives
 * @param {string[]} [extraScriptSources]
 * @returns {string}
 */
export function cspHeaderValue(directives, extraScriptSources = []) {
  return Object.entries(directives)
    .map(([name, sources]) => {
      const all = name === 'script-src' ? [...sources, ...extraScriptSources] : sources;
      return [name, ...all.map((s) => (KEYWORDS.has(s) || /^(sha256|sha384|sha512|nonce)-/.test(s) ? `'${s}'` : s))].join(' ');
    })
    .join('; ');
}
