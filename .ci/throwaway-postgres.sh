# Sourced by .ci/run (and usable by hand: `source .ci/throwaway-postgres.sh; start_throwaway_postgres`):
# a PostgreSQL cluster in a temporary folder, run as the postgres user, listening on 127.0.0.1 only,
# for the team server's tests. Exports TEAM_SERVER_TEST_DATABASE_URL; stop_throwaway_postgres removes it.
start_throwaway_postgres() {
  local bin
  bin=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -1)
  if [ -z "$bin" ] || [ ! -x "$bin/initdb" ]; then
    if [ "$(id -u)" -ne 0 ]; then
      echo "PostgreSQL is missing and this user cannot install it (apt-get install -y postgresql)." >&2
      return 1
    fi
    export DEBIAN_FRONTEND=noninteractive
    apt-get update -qq && apt-get install -y -qq --no-install-recommends postgresql >/dev/null
    bin=$(ls -d /usr/lib/postgresql/*/bin | sort -V | tail -1)
  fi
  PG_TMP=$(mktemp -d /tmp/kinnote-pg.XXXXXX)
  chown postgres "$PG_TMP" 2>/dev/null || true
  local as=()
  [ "$(id -u)" -eq 0 ] && as=(runuser -u postgres --)
  "${as[@]}" "$bin/initdb" -D "$PG_TMP/data" -A trust -U postgres --no-sync >/dev/null
  PG_PORT=${PG_PORT:-55432}
  "${as[@]}" "$bin/pg_ctl" -D "$PG_TMP/data" -l "$PG_TMP/log" -w -o "-p $PG_PORT -k $PG_TMP -c listen_addresses=127.0.0.1 -c fsync=off -c max_connections=200" start >/dev/null
  PG_BIN=$bin
  export PG_BIN PG_TMP PG_PORT
  export TEAM_SERVER_TEST_DATABASE_URL="postgres://postgres@127.0.0.1:$PG_PORT/postgres"
  echo "== throwaway PostgreSQL $("$bin/postgres" --version | awk '{print $3}') on 127.0.0.1:$PG_PORT in $PG_TMP"
}

stop_throwaway_postgres() {
  if [ -n "${PG_TMP:-}" ] && [ -d "$PG_TMP/data" ]; then
    local as=()
    [ "$(id -u)" -eq 0 ] && as=(runuser -u postgres --)
    "${as[@]}" "$PG_BIN/pg_ctl" -D "$PG_TMP/data" -m immediate stop >/dev/null 2>&1 || true
    rm -rf "$PG_TMP"
  fi
}
