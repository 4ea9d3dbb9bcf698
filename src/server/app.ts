import { Hono, type Context } from 'hono';
import { bodyLimit } from 'hono/body-limit';
import { cors } from 'hono/cors';
import { SERVER_TIME_HEADER } from '../lib/sync';
import { RateLimit } from './rate-limit';
import { ROLES, TeamServerError, type Device, type Role, type TeamService } from './team-service';

type Env = { Variables: { device: Device } };


export interface AppOptions {
  /** Enrolment attempts per client address per window (default 10 per 15 minutes). */
  readonly enrolLimit?: number;
  readonly enrolWindowMs?: number;
  /** The client address of a request (the socket's remote address under @hono/node-server). */
  readonly clientAddress?: (c: Context) => string;
}

/**
 * The team server's HTTP JSON API (version 1). Every route but /v1/health and /v1/enrol needs
 * `Authorization: Bearer <device token>` and acts only on that device's team. Errors are
 * `{ "error": message, "issues"?: [...] }` with the status of the refusal.
 */
export function createApp(service: TeamService, options: AppOptions = {}): Hono<Env> {
  const app = new Hono<Env>();
  const enrolLimit = new RateLimit(options.enrolLimit ?? 10, options.enrolWindowMs ?? 15 * 60_000);
  const address = options.clientAddress ?? ((c: Context) => c.req.header('x-kinnote-test-address') ?? 'unknown');

  // Bearer tokens, no cookies: any origin may call, so the app can live on its own address.
  app.use('/v1/*', cors({ origin: '*', allowHeaders: ['Authorization', 'Content-Type'], allowMethods: ['GET', 'POST'], exposeHeaders: [SERVER_TIME_HEADER] }));
  // Every answer, refusals included, tells the device the server's time: devices stamp records by it.
  app.use('/v1/*', async (c, next) => {
    await next();
    c.res.headers.set(SERVER_TIME_HEADER, String(service.now()));
  });
  app.use('/v1/*', bodyLimit({ maxSize: 32 * 1024 * 1024, onError: (c) => c.json({ error: 'request body over 32 MB: push smaller batches' }, 413) }));

  app.onError((error, c) => {
    if (error instanceof TeamServerError) return c.json({ error: error.message, ...(error.issues ? { issues: error.issues.slice(0, 100) } : {}) }, error.status);
    if (error instanceof SyntaxError) return c.json({ error: `body is not JSON: ${error.message}` }, 400);
    console.error(error);
    return c.json({ error: 'internal error' }, 500);
  });

  app.get('/v1/health', (c) => c.json({ ok: true }));

  app.post('/v1/enrol', async (c) => {
    const waitMs = enrolLimit.hit(address(c));
    if (waitMs > 0) {
      c.header('Retry-After', String(Math.ceil(waitMs / 1000)));
      return c.json({ error: 'too many enrolment attempts from this address; wait and try again' }, 429);
    }
    const body = await json<{ auth?: unknown; label?: unknown }>(c);
    if (typeof body.auth !== 'string' || typeof body.label !== 'string') throw new TeamServerError(400, 'body: must be {"auth": string, "label": string}');
    return c.json(await service.enrol(body.auth, body.label));
  });

  app.use('/v1/*', async (c, next) => {
    const header = c.req.header('authorization') ?? '';
    const match = /^Bearer ([A-Za-z0-9_-]{20,100})$/.exec(header);
    if (!match) throw new TeamServerError(401, 'missing or malformed Authorization: Bearer <device token>');
    c.set('device', await service.authenticate(match[1]!));
    await next();
  });

  app.get('/v1/me', (c) => {
    const d = c.get('device');
    return c.json({ deviceId: d.id, teamId: d.teamId, role: d.role, label: d.label });
  });

  app.post('/v1/codes', async (c) => {
    const body = await json<{ auth?: unknown; role?: unknown; ttlMs?: unknown; keyEnvelope?: unknown }>(c);
    if (typeof body.auth !== 'string' || !ROLES.includes(body.role as Role) || typeof body.ttlMs !== 'number') {
      throw new TeamServerError(400, 'body: must be {"auth": string, "role": "clinician"|"auditor"|"admin", "ttlMs": number, "keyEnvelope": string|null}');
    }
    const keyEnvelope = typeof body.keyEnvelope === 'string' ? body.keyEnvelope : null;
    return c.json(await service.issueCode(c.get('device'), { auth: body.auth, role: body.role as Role, ttlMs: body.ttlMs, keyEnvelope }));
  });

  app.get('/v1/devices', async (c) => c.json({ devices: await service.listDevices(c.get('device')) }));
  app.post('/v1/devices/:id/revoke', async (c) => {
    await service.revoke(c.get('device'), c.req.param('id'));
    return c.json({ revoked: c.req.param('id') });
  });

  app.post('/v1/push', async (c) => c.json(await service.push(c.get('device'), await json(c))));

  app.get('/v1/pull', async (c) => {
    const cursor = Number(c.req.query('cursor') ?? '0');
    const limit = Number(c.req.query('limit') ?? '500');
    return c.json(await service.pull(c.get('device'), cursor, limit));
  });

  app.get('/v1/conflicts', async (c) => c.json({ conflicts: await service.conflicts(c.get('device'), Number(c.req.query('since') ?? '0') || 0) }));

  return app;
}

async function json<T>(c: Context): Promise<T> {
  const text = await c.req.text();
  const parsed = JSON.parse(text) as unknown;
  if (typeof parsed !== 'object' || parsed === null || Array.isArray(parsed)) throw new TeamServerError(400, 'body: must be a JSON object');
  return parsed as T;
}
