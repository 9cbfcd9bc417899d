#!/usr/bin/env bash
# `npm start`: everything from a fresh Debian 12 machine (root, Node 20 + npm) to a served app.
# Installs what is missing, writes .env.local, starts the project-local MariaDB, applies
# migrations, seeds the demo organisation (idempotent), starts the fake SMTP server when
# FAKE_SMTP=1, builds only when the sources changed, then serves on 127.0.0.1:${PORT:-3000}.
set -euo pipefail
cd "$(dirname "$0")/.."
# shellcheck source=scripts/common.sh
. scripts/common.sh

fail() { warn "start: $*"; exit 1; }

check_node || exit 1
ensure_node_modules || fail "could not install the npm packages"
node scripts/ensure-env.mjs || fail "could not write .env.local"
bash scripts/db.sh start || fail "the database did not start (see above; its log is .data/mariadb/mariadbd.err)"
node --import tsx scripts/migrate.ts || fail "database migrations failed (see above)"

mkdir -p .data
if ! node --import tsx scripts/seed.ts 2>&1 | tee .data/seed.log; then
  fail "seeding the demo organisation failed (see above)"
fi

if fake_smtp_wanted; then start_fake_smtp || fail "the fake SMTP server did not start"; fi

build_if_changed || fail "the production build failed"

PORT=${PORT:-3000}
URL="http://127.0.0.1:$PORT"
APP_URL_SET=$(env_value APP_URL)
if [ -n "$APP_URL_SET" ] && [ "$APP_URL_SET" != "$URL" ]; then
  warn "start: note: APP_URL in .env.local is $APP_URL_SET but the server listens on $URL (links in e-mails use APP_URL)"
fi

say ""
say "Ohmstead is starting at $URL"
if grep -q '^Role ' .data/seed.log; then
  say "Demo accounts (organisation “Wrenfield Panelcraft”; demo only):"
  sed -n '/^Role /,$p' .data/seed.log | sed 's/^/  /'
fi
if fake_smtp_wanted; then say "Mail goes to the local fake SMTP server; an administrator reads it under Admin → Mailbox."; fi
say "Stop with Ctrl-C; stop the database with: npm run db:stop"
say ""

export NODE_ENV=production
exec node node_modules/next/dist/bin/next start -H 127.0.0.1 -p "$PORT"
