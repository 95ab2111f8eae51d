#!/usr/bin/env bash
# The main job in one command: install what is missing, build, and open the bundled
# sample reservoir in the desktop app. With no display, print its balance sheet
# and checks with the command-line tool instead.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/bootstrap.sh"
tl_install_missing_packages
tl_build

sample="$TL_ROOT/sample_projects/reservoir.tledger"
gui="$TL_BUILD_DIR/app/gui/trophic-ledger"
if [ -x "$gui" ] && [ -n "${DISPLAY:-}${WAYLAND_DISPLAY:-}" ]; then
  exec "$gui" "$@"
fi
echo "== No display: the sample reservoir's balance sheet (tledger solve) and checks (tledger check)"
"$TL_BUILD_DIR/app/tledger" solve "$sample" --scenario baseline || true
"$TL_BUILD_DIR/app/tledger" check "$sample" --scenario baseline || true
