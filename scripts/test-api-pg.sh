#!/usr/bin/env bash
# npm run test:api:pg — the PostgreSQL test tier. Builds nothing: run `npm run build`
# first. Starts a throw-away PostgreSQL cluster (scripts/pg-cluster.sh) unless
# CYCLODIAL_TEST_PG_URL already names one, runs the dialect round-trip test and the
# API suite with every test server on a fresh PostgreSQL database of its own, and
# stops the cluster only if this run started it (a cluster already running in
# $PG_CLUSTER_DIR is reused and left running). Extra arguments go to vitest.
set -euo pipefail
cd "$(dirname "$0")/.."

if [ -z "${CYCLODIAL_TEST_PG_URL:-}" ]; then
  if scripts/pg-cluster.sh status >/dev/null 2>&1; then
    eval "$(scripts/pg-cluster.sh start)"   # reuses the running cluster; left running
  else
    eval "$(scripts/pg-cluster.sh start)"
    trap 'scripts/pg-cluster.sh stop' EXIT
  fi
fi
export CYCLODIAL_TEST_PG_URL
echo "--- PostgreSQL tier on ${CYCLODIAL_TEST_PG_URL}"

status=0
npx vitest run --project unit tests/unit/db/ tests/unit/fundus/photo-store.test.ts || status=$?
npx vitest run --project api "$@" || status=$?
exit $status
