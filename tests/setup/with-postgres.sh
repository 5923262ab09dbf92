#!/usr/bin/env bash
# Runs a command against a throw-away PostgreSQL cluster (Debian's postgresql package):
# initdb in a temporary folder owned by the postgres user, listening on 127.0.0.1 only,
# DATABASE_URL exported for the command, the cluster stopped and removed afterwards.
#   bash tests/setup/with-postgres.sh npx vitest run --project api
set -euo pipefail
PGBIN=${PGBIN:-$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1)}
if [ -z "$PGBIN" ] || [ ! -x "$PGBIN/initdb" ]; then
  echo "with-postgres: PostgreSQL server binaries not found (apt-get install postgresql)" >&2
  exit 1
fi
PGPORT=${PGPORT:-$(python3 -c 'import socket; s=socket.socket(); s.bind(("127.0.0.1",0)); print(s.getsockname()[1]); s.close()')}
DIR=$(mktemp -d /tmp/emberline-pg-XXXXXX)
as_pg() {
  if [ "$(id -u)" = 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi
}
[ "$(id -u)" = 0 ] && chown postgres:postgres "$DIR"
cleanup() {
  as_pg "$PGBIN/pg_ctl" -D "$DIR/data" -m fast stop >/dev/null 2>&1 || true
  rm -rf "$DIR"
}
trap cleanup EXIT
as_pg "$PGBIN/initdb" -D "$DIR/data" -U postgres --auth=trust -E UTF8 >/dev/null
as_pg "$PGBIN/pg_ctl" -D "$DIR/data" -o "-c listen_addresses=127.0.0.1 -p $PGPORT -k $DIR -c max_connections=200 -c fsync=off" -l "$DIR/log" -w start >/dev/null
export DATABASE_URL="postgres://postgres@127.0.0.1:$PGPORT/postgres"
echo "with-postgres: PostgreSQL $("$PGBIN/postgres" --version | awk '{print $3}') on 127.0.0.1:$PGPORT"
"$@"
