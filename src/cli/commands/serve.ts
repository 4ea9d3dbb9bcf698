import { createServer } from 'node:http';
import { readFile, stat } from 'node:fs/promises';
import { extname, join, normalize, resolve, sep } from 'node:path';
import { cspDirectives, cspHeaderValue, teamServerOrigin } from '../../lib/security';
import { optionWholeNumber, parseOptions, RefusedInput, type CliCommand } from '../command';

const contentTypes: Readonly<Record<string, string>> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.webmanifest': 'application/manifest+json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.txt': 'text/plain; charset=utf-8',
  '.csv': 'text/csv; charset=utf-8',
  '.woff2': 'font/woff2',
};

/**
 * Headers on every response: the page's Content-Security-Policy (the directives of
 * src/lib/security, plus the script hashes SvelteKit wrote into the built page's meta tag, and
 * frame-ancestors, which only a header can carry), no MIME sniffing, no referrer, no framing.
 */
export function securityHeaders(indexHtmlText: string, teamServer: string | null): Record<string, string> {
  const meta = /<meta http-equiv="content-security-policy" content="([^"]*)"/i.exec(indexHtmlText)?.[1] ?? '';
  const hashes = [...meta.matchAll(/'(sha(?:256|384|512)-[A-Za-z0-9+/=]+)'/g)].map((m) => m[1] as string);
  return {
    'content-security-policy': cspHeaderValue(cspDirectives(teamServer), hashes),
    'x-content-type-options': 'nosniff',
    'referrer-policy': 'no-referrer',
    'x-frame-options': 'DENY',
  };
}

/** Starts a static server for build/ with a single-page fallback; resolves when it listens. */
export async function startStaticServer(
  rootDir: string,
  port: number,
  host = '127.0.0.1',
  teamServer: string | null = null,
): Promise<{ url: string; close: () => Promise<void> }> {
  const root = resolve(rootDir);
  const indexHtml = join(root, 'index.html');
  let headers: Record<string, string>;
  try {
    headers = securityHeaders(await readFile(indexHtml, 'utf8'), teamServer);
  } catch {
    throw new RefusedInput(`${indexHtml}: not found; run \`npm run build\` first`);
  }
  const server = createServer((request, response) => {
    void (async () => {
      const url = new URL(request.url ?? '/', `http://${host}`);
      let decoded: string;
      try {
        decoded = decodeURIComponent(url.pathname);
      } catch {
        response.writeHead(400, { ...headers, 'content-type': 'text/plain; charset=utf-8' });
        response.end('Bad request: the path has a malformed percent-encoding\n');
        return;
      }
      const wanted = normalize(decoded).replace(/^([/\\])+/, '');
      let file = join(root, wanted);
      if (!file.startsWith(root + sep) && file !== root) file = indexHtml;
      let body: Buffer;
      try {
        const info = await stat(file);
        if (info.isDirectory()) file = join(file, 'index.html');
        body = await readFile(file);
      } catch {
        // Single-page app: every unknown path gets the shell, the client router takes over.
        file = indexHtml;
        body = await readFile(file);
      }
      const immutable = file.includes(`${sep}_app${sep}immutable${sep}`);
      response.writeHead(200, {
        ...headers,
        'content-type': contentTypes[extname(file)] ?? 'application/octet-stream',
        // The service worker and the shell must be revalidated so that updates are seen.
        'cache-control': immutable ? 'public, max-age=31536000, immutable' : 'no-cache',
      });
      response.end(request.method === 'HEAD' ? undefined : body);
    })().catch((error: unknown) => {
      response.writeHead(500, { ...headers, 'content-type': 'text/plain; charset=utf-8' });
      response.end(`Server error: ${(error as Error).name ?? 'error'}\n`);
    });
  });
  await new Promise<void>((done, fail) => {
    server.once('error', (error: NodeJS.ErrnoException) => {
      const why = error.code === 'EADDRINUSE' ? 'is in use by another program; stop it or choose another --port' : error.code === 'EACCES' ? 'needs privileges; choose a port above 1023' : `cannot be opened (${error.code ?? error.message})`;
      fail(new RefusedInput(`--port ${port}: ${host}:${port} ${why}`));
    });
    server.listen(port, host, () => done());
  });
  const address = server.address();
  const actualPort = typeof address === 'object' && address ? address.port : port;
  return {
    url: `http://${host}:${actualPort}`,
    close: () => new Promise<void>((done) => server.close(() => done())),
  };
}

export const serveCommand: CliCommand = {
  name: 'serve',
  summary: 'serve the production build (build/) on 127.0.0.1 with a single-page fallback',
  usage: 'kinnote serve [--port 4173] [--dir build]',
  async run(args, io) {
    const { values } = parseOptions(args, ['port', 'dir']);
    const port = optionWholeNumber(values.get('port'), 'port', 0, 65535) ?? 4173;
    let teamServer: string | null;
    try {
      teamServer = teamServerOrigin(io.env.KINNOTE_TEAM_SERVER_ORIGIN);
    } catch (error) {
      throw new RefusedInput((error as Error).message);
    }
    const server = await startStaticServer(resolve(io.cwd, values.get('dir') ?? 'build'), port, '127.0.0.1', teamServer);
    io.stderr(`Kinnote is served at ${server.url} (Ctrl+C stops it)`);
    await new Promise<void>(() => undefined);
    return 0;
  },
};
