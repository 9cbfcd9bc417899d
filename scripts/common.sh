# Shared steps of scripts/start.sh, scripts/dev.sh and scripts/test.sh (sourced, not run).
# Each function prints what it does and returns non-zero with a message on failure.

export NEXT_TELEMETRY_DISABLED=1
export DEBIAN_FRONTEND=noninteractive

say() { printf '%s\n' "$*"; }
warn() { printf '%s\n' "$*" >&2; }

# Node 20.19+ (or 22+) is the one thing the machine must already have.
check_node() {
  if ! command -v node >/dev/null 2>&1; then
    warn "Node.js is not installed. Install Node 20 (20.19 or later) and npm, then run this again."
    return 1
  fi
  local major
  major=$(node -p 'process.versions.node.split(".")[0]')
  if [ "$major" -lt 20 ]; then
    warn "Node.js $(node -v) is too old; Ohmstead needs Node 20.19 or later."
    return 1
  fi
}

# npm ci only when node_modules is missing or older than package-lock.json. The marker
# is touched after a successful install; npm's own node_modules/.package-lock.json
# stands in for it in a tree installed by hand.
INSTALL_MARKER=node_modules/.ohmstead-installed
ensure_node_modules() {
  local marker=""
  if [ -f "$INSTALL_MARKER" ]; then marker=$INSTALL_MARKER
  elif [ -f node_modules/.package-lock.json ]; then marker=node_modules/.package-lock.json
  fi
  if [ -d node_modules ] && [ -n "$marker" ] && ! [ package-lock.json -nt "$marker" ]; then
    [ "$marker" = "$INSTALL_MARKER" ] || touch "$INSTALL_MARKER"
    return 0
  fi
  say "setup: installing npm packages (npm ci)…"
  if ! npm ci --no-audit --no-fund --loglevel=error; then
    warn "setup: npm ci failed (see the messages above). Is the npm registry reachable?"
    return 1
  fi
  touch "$INSTALL_MARKER"
}

# Installs missing Debian packages (root only; otherwise says what to run).
APT_UPDATED=""
ensure_apt() {
  local missing=() p
  for p in "$@"; do
    dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q 'install ok installed' || missing+=("$p")
  done
  [ ${#missing[@]} -eq 0 ] && return 0
  if [ "$(id -u)" != "0" ]; then
    warn "setup: missing Debian packages: ${missing[*]}. Run as root: apt-get update && apt-get install -y ${missing[*]}"
    return 1
  fi
  say "setup: installing Debian packages: ${missing[*]} (one time)…"
  if [ -z "$APT_UPDATED" ]; then apt-get update -qq || { warn "setup: apt-get update failed"; return 1; }; APT_UPDATED=1; fi
  apt-get install -y -qq "${missing[@]}" >/dev/null || { warn "setup: apt-get install ${missing[*]} failed"; return 1; }
}

# Reads one key from .env.local (the environment wins, as in the app).
env_value() {
  local key=$1
  if [ -n "${!key:-}" ]; then printf '%s' "${!key}"; return; fi
  [ -f .env.local ] || return 0
  grep -E "^${key}=" .env.local | tail -1 | cut -d= -f2- | sed -E 's/^"(.*)"$/\1/; s/^'"'"'(.*)'"'"'$/\1/'
}

# Content hash of everything the production build reads: tracked and untracked (not ignored)
# files, without tests, docs and the shell scripts. Any change → a new build.
BUILD_STAMP=.next/ohmstead-source.sha256
source_hash() {
  {
    if git rev-parse --is-inside-work-tree >/dev/null 2>&1; then
      git ls-files -co --exclude-standard
    else
      find . -type f -not -path './node_modules/*' -not -path './.next/*' -not -path './.data/*' -not -path './.git/*' | sed 's|^\./||'
    fi
  } | grep -Ev '^(tests/|bench/|\.ci/|[^/]*\.md$|scripts/.*\.sh$|.*\.tsbuildinfo$)' | LC_ALL=C sort -u |
    while IFS= read -r f; do [ -f "$f" ] && printf '%s\0' "$f"; done |
    xargs -0 -r sha256sum | sha256sum | cut -c1-64
}

# Runs `next build` only when the sources changed since the last successful build.
build_if_changed() {
  local h
  h=$(source_hash)
  if [ -f .next/BUILD_ID ] && [ -f "$BUILD_STAMP" ] && [ "$(cat "$BUILD_STAMP")" = "$h" ]; then
    say "build: sources unchanged since the last build, reusing .next"
    return 0
  fi
  say "build: building the production app (next build)…"
  rm -f "$BUILD_STAMP"
  if ! node node_modules/next/dist/bin/next build; then
    warn "build: next build failed (see the messages above)"
    return 1
  fi
  printf '%s\n' "$h" >"$BUILD_STAMP"
}

# The local fake SMTP server (loopback only), reused when its pid file points at a live process.
FAKE_SMTP_PID=.data/fake-smtp.pid
start_fake_smtp() {
  mkdir -p .data
  if [ -f "$FAKE_SMTP_PID" ] && kill -0 "$(cat "$FAKE_SMTP_PID")" 2>/dev/null; then
    say "mail: fake SMTP server already running (pid $(cat "$FAKE_SMTP_PID"))"
    return 0
  fi
  local port
  port=$(env_value SMTP_PORT); port=${port:-2525}
  nohup node --import tsx scripts/fake-smtp.ts >.data/fake-smtp.log 2>&1 &
  local pid=$!
  echo "$pid" >"$FAKE_SMTP_PID"
  if ! node scripts/wait-for.mjs "tcp://127.0.0.1:$port" 15 >/dev/null; then
    warn "mail: the fake SMTP server did not start on 127.0.0.1:$port. End of .data/fake-smtp.log:"
    tail -20 .data/fake-smtp.log >&2 || true
    kill "$pid" 2>/dev/null || true
    rm -f "$FAKE_SMTP_PID"
    return 1
  fi
  say "mail: fake SMTP server on 127.0.0.1:$port (pid $pid), messages kept in $(env_value FAKE_MAILBOX_DIR)"
}

fake_smtp_wanted() {
  case "$(env_value FAKE_SMTP)" in 1|true) return 0 ;; *) return 1 ;; esac
}
