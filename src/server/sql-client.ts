/**
 * The one database surface the team server uses, implemented over PGlite (embedded PostgreSQL in
 * WebAssembly, a data folder) and over node-postgres (a PostgreSQL server from DATABASE_URL), so the
 * same SQL and migrations run on both.
 */
export interface SqlQueryable {
  query<T = Record<string, unknown>>(sql: string, params?: readonly unknown[]): Promise<T[]>;
}

export interface SqlClient extends SqlQueryable {
  /** Runs `work` in one transaction (BEGIN … COMMIT; ROLLBACK when it throws). */
  transaction<T>(work: (tx: SqlQueryable) => Promise<T>): Promise<T>;
  /** Runs several statements without parameters (migrations). */
  exec(sql: string): Promise<void>;
  readonly kind: 'pglite' | 'postgres';
  close(): Promise<void>;
}

/** Embedded PostgreSQL (PGlite): `dataDir` a folder, or undefined for memory only (tests). */
export async function openPglite(dataDir: string | undefined): Promise<SqlClient> {
  const { PGlite } = await import('@electric-sql/pglite');
  const db = dataDir === undefined ? new PGlite() : new PGlite(dataDir);
  await db.waitReady;
  // PGlite is one connection: a second transaction must wait for the first, so serialise here.
  let chain: Promise<unknown> = Promise.resolve();
  const exclusive = <T>(work: () => Promise<T>): Promise<T> => {
    const next = chain.then(work, work);
    chain = next.catch(() => undefined);
    return next;
  };
  const query = async <T>(q: { query: typeof db.query }, sql: string, params?: readonly unknown[]) => (await q.query<T>(sql, params ? [...params] : [])).rows;
  return {
    kind: 'pglite',
    query: (sql, params) => exclusive(() => query(db, sql, params)),
    transaction: (work) => exclusive(() => db.transaction((tx) => work({ query: (sql, params) => query(tx, sql, params) }))),
    exec: (sql) => exclusive(async () => void (await db.exec(sql))),
    close: () => exclusive(() => db.close()),
  };
}

/** A PostgreSQL server through a node-postgres pool of `max` connections. */
export async function openPostgres(connectionString: string, max = 10): Promise<SqlClient> {
  const pg = (await import('pg')).default;
  const pool = new pg.Pool({ connectionString, max });
  // Fail at start, with the reason, when the server is unreachable.
  await pool.query('SELECT 1');
  return {
    kind: 'postgres',
    query: async (sql, params) => (await pool.query(sql, params ? [...params] : [])).rows,
    async transaction(work) {
      const client = await pool.connect();
      try {
        await client.query('BEGIN');
        const result = await work({ query: async (sql, params) => (await client.query(sql, params ? [...params] : [])).rows });
        await client.query('COMMIT');
        return result;
      } catch (error) {
        await client.query('ROLLBACK').catch(() => undefined);
        throw error;
      } finally {
        client.release();
      }
    },
    exec: async (sql) => void (await pool.query(sql)),
    close: () => pool.end(),
  };
}
