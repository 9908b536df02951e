#!/usr/bin/env bash
# `npm run dev`: services, migrations and demo data as for `npm start`, then Vite's dev server.
set -euo pipefail
. "$(dirname "$0")/lib.sh"
cd "$ROOT"
ensure_node_modules
bash scripts/services.sh start dev
export FRACTILE_ENV_FILE="$ROOT/.env"
npx tsx scripts/migrate.ts up
npx tsx scripts/seed.ts --if-empty
load_env "$ROOT/.env"
# Vite serves on 5173; ORIGIN must match it there for form posts.
ORIGIN="http://127.0.0.1:5173" exec npx vite dev
