#!/usr/bin/env bash
# Installs the Debian packages Cairn needs when they are missing. Idempotent.
# As root it runs apt-get; otherwise it prints the exact command and stops.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
need=()
[ -n "$(pg_bin)" ] && [ -x "$(pg_bin)/initdb" ] || need+=(postgresql)
command -v redis-server >/dev/null 2>&1 || need+=(redis-server)
command -v ffmpeg >/dev/null 2>&1 && command -v ffprobe >/dev/null 2>&1 || need+=(ffmpeg)
if [ "${CAIRN_NEED_BROWSER:-0}" = "1" ]; then
  [ -x /usr/bin/chromium ] || need+=(chromium)
  command -v pdftoppm >/dev/null 2>&1 || need+=(poppler-utils)
fi
if [ ${#need[@]} -eq 0 ]; then log "Debian packages present"; exit 0; fi
if [ "$(id -u)" != "0" ]; then
  echo "Cairn needs these Debian packages: ${need[*]}"
  echo "Run: sudo apt-get update && sudo apt-get install -y ${need[*]}"
  exit 1
fi
log "installing: ${need[*]}"
export DEBIAN_FRONTEND=noninteractive
apt-get update -qq
apt-get install -y -qq --no-install-recommends "${need[@]}" >/dev/null
log "installed: ${need[*]}"
