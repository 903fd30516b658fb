#!/usr/bin/env bash
# Starts everything: Postgres, the local fakes, migrations, demo data, a production build and the app.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/lib/system.sh
ensure_debian_packages postgresql:/usr/lib/postgresql/15/bin/initdb
ensure_node_modules
exec node_modules/.bin/tsx scripts/start.ts
