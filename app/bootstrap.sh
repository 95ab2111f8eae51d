#!/usr/bin/env bash
# Shared by app/run.sh and tests/run.sh: install the Debian packages the project
# needs (only those missing), then configure and build Release into build/.
set -euo pipefail

TL_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
TL_BUILD_DIR="${TL_BUILD_DIR:-$TL_ROOT/build}"

# Build, test and GUI dependencies, all from Debian.
TL_PACKAGES=(cmake g++ ninja-build pkg-config
             qt6-base-dev qt6-svg-dev libqcustomplot-dev libeigen3-dev libsqlite3-dev
             libgtest-dev libbenchmark-dev libnlopt-cxx-dev nlohmann-json3-dev xvfb xauth
             poppler-utils
             python3 python3-numpy python3-scipy python3-networkx)

tl_install_missing_packages() {
  local missing=()
  for p in "${TL_PACKAGES[@]}"; do
    dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
  done
  [ ${#missing[@]} -eq 0 ] && return 0
  echo "== Installing missing Debian packages: ${missing[*]}"
  local sudo=()
  if [ "$(id -u)" -ne 0 ]; then
    command -v sudo >/dev/null || { echo "Need root or sudo to install: ${missing[*]}" >&2; exit 2; }
    sudo=(sudo)
  fi
  "${sudo[@]}" apt-get update -qq
  DEBIAN_FRONTEND=noninteractive "${sudo[@]}" apt-get install -y -qq --no-install-recommends "${missing[@]}"
}

tl_build() {
  echo "== Configuring and building (Release) in $TL_BUILD_DIR"
  cmake -S "$TL_ROOT" -B "$TL_BUILD_DIR" -G Ninja -DCMAKE_BUILD_TYPE=Release "$@"
  cmake --build "$TL_BUILD_DIR" --parallel "$(nproc)"
}
