import { createServer } from 'node:http';
import { readFile, stat } from 'node:fs/promises';
import { extname, join, normalize, resolve, sep } from 'node:path';
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

/** Starts a static server for build/ with a single-page fallback; resolves when it listens. */
export async function startStaticServer(
  rootDir: string,
  port: number,
  host = '127.0.0.1',
): Promise<{ url: string; close: () => Promise<void> }> {
  const root = resolve(rootDir);
  const indexHtml = join(root, 'index.html');
  try {
    await stat(indexHtml);
  } catch {
    throw new RefusedInput(`${indexHtml}: not found; run \`npm run build\` first`);
  }
  const server = createServer((request, response) => {
    void (async () => {
      const url = new URL(request.url ?? '/', `http://${host}`);
      const wanted = normalize(decodeURIComponent(url.pathname)).replace(/^([/\\])+/, '');
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
        'content-type': contentTypes[extname(file)] ?? 'application/octet-stream',
        // The service worker and the shell must be revalidated so that updates are seen.
        'cache-control': immutable ? 'public, max-age=31536000, immutable' : 'no-cache',
      });
      response.end(request.method === 'HEAD' ? undefined : body);
    })().catch((error: unknown) => {
      response.writeHead(500, { 'content-type': 'text/plain' });
      response.end(String(error));
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
    const server = await startStaticServer(resolve(io.cwd, values.get('dir') ?? 'build'), port);
    io.stderr(`Kinnote is served at ${server.url} (Ctrl+C stops it)`);
    await new Promise<void>(() => undefined);
    return 0;
  },
};
