#!/usr/bin/env bash
# Install what is missing, build, and run the whole test suite with ctest.
# TL_RUN_SANITIZERS=1 then runs the core and CLI tests again under AddressSanitizer +
# UndefinedBehaviorSanitizer (CMakePresets.json "sanitize": no GUI, no benchmarks, into
# build-sanitize/). It is off by default until a full sanitizer run has been seen green
# and its time on CI measured (issue 12, item 10).
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/../app/bootstrap.sh"
tl_install_missing_packages
tl_build -DTL_BUILD_TESTS=ON
export QT_QPA_PLATFORM="${QT_QPA_PLATFORM:-offscreen}"
(cd "$TL_BUILD_DIR" && ctest --output-on-failure --parallel "$(nproc)" --timeout 900)

if [ "${TL_RUN_SANITIZERS:-0}" = 1 ]; then
  echo "== Sanitizer run (AddressSanitizer + UBSan): core and CLI tests, fuzz corpus replay"
  start=$(date +%s)
  cd "$TL_ROOT"
  cmake --preset sanitize >/dev/null
  cmake --build --preset sanitize --parallel "$(nproc)"
  # The preset leaves out the cross-checks, the benchmark smoke runs and suites named *Large.
  ctest --preset sanitize --parallel "$(nproc)" --timeout 900
  echo "== Sanitizer run took $(( $(date +%s) - start )) s"
fi
