# Sourced by start.sh and test.sh: npm packages, PostgreSQL, Chromium and poppler-utils from Debian, when missing.
need_apt=()
if ! ls /usr/lib/postgresql/*/bin/initdb >/dev/null 2>&1; then need_apt+=(postgresql); fi
if [ "${CHAINPROOF_NEEDS_BROWSER:-0}" = 1 ] && [ ! -x /usr/bin/chromium ]; then need_apt+=(chromium); fi
# pdftoppm, pdftotext and pdfinfo: the printed report's test renders its PDF to images.
if [ "${CHAINPROOF_NEEDS_BROWSER:-0}" = 1 ] && ! command -v pdftoppm >/dev/null 2>&1; then need_apt+=(poppler-utils); fi
if [ ${#need_apt[@]} -gt 0 ]; then
  echo "chainproof: installing ${need_apt[*]} from Debian's packages"
  sudo_cmd=""; [ "$(id -u)" != 0 ] && sudo_cmd="sudo"
  $sudo_cmd apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $sudo_cmd apt-get install -y -qq "${need_apt[@]}" >/dev/null
fi
if [ ! -f node_modules/.package-lock.json ] || [ package-lock.json -nt node_modules/.package-lock.json ]; then
  echo "chainproof: installing npm packages (npm ci)"
  npm ci --no-audit --no-fund --loglevel=error
fi
