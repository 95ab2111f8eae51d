#!/usr/bin/env bash
# Install what is missing, build, and run the whole test suite with ctest.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/../app/bootstrap.sh"
tl_install_missing_packages
tl_build -DTL_BUILD_TESTS=ON
export QT_QPA_PLATFORM="${QT_QPA_PLATFORM:-offscreen}"
cd "$TL_BUILD_DIR"
ctest --output-on-failure --parallel "$(nproc)" --timeout 900
