#!/usr/bin/env bash
# `npm run dev`: the same preparation as `npm start`, then `next dev` (hot reload) on 127.0.0.1:${PORT:-3000}.
set -euo pipefail
cd "$(dirname "$0")/.."
# shellcheck source=scripts/common.sh
. scripts/common.sh

fail() { warn "dev: $*"; exit 1; }

check_node || exit 1
ensure_node_modules || fail "could not install the npm packages"
node scripts/ensure-env.mjs || fail "could not write .env.local"
bash scripts/db.sh start || fail "the database did not start (see above; its log is .data/mariadb/mariadbd.err)"
node --import tsx scripts/migrate.ts || fail "database migrations failed (see above)"
node --import tsx scripts/seed.ts || fail "seeding the demo organisation failed (see above)"
if fake_smtp_wanted; then start_fake_smtp || fail "the fake SMTP server did not start"; fi

PORT=${PORT:-3000}
say "Ohmstead (development mode) at http://127.0.0.1:$PORT — stop with Ctrl-C"
exec node node_modules/next/dist/bin/next dev -H 127.0.0.1 -p "$PORT"
