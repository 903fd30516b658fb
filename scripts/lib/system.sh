# Debian packages the project needs; installed only when missing. Sourced by the start and test commands.
ensure_debian_packages() {
  local missing=()
  for spec in "$@"; do
    local pkg=${spec%%:*} probe=${spec#*:}
    [ -e "$probe" ] || missing+=("$pkg")
  done
  [ ${#missing[@]} -eq 0 ] && return 0
  echo "Installing Debian packages: ${missing[*]}"
  local sudo=""
  [ "$(id -u)" -ne 0 ] && sudo="sudo"
  $sudo apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
}

ensure_node_modules() {
  # npm ci when node_modules is missing or older than the lock file.
  if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
    echo "Installing npm packages (npm ci)…"
    npm ci --no-audit --no-fund --loglevel=error
  fi
}
