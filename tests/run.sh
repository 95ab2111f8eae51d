#!/usr/bin/env bash
# Install what is missing, build, and run the whole test suite with ctest; then the
# sanitizer pass: tests again under AddressSanitizer + UndefinedBehaviorSanitizer (with
# float-cast-overflow) (CMakePresets.json "sanitize": -O1, no GUI, no benchmarks, into
# build-sanitize/).
#
#   TL_RUN_SANITIZERS unset|all|1   every core, CLI and fuzz-replay test (ctest --preset
#                                   sanitize; default; issue 12, item 10)
#   TL_RUN_SANITIZERS=subset        only the programs below, for a quicker local run
#   TL_RUN_SANITIZERS=0             no sanitizer pass
#
# The subset is the programs that read untrusted bytes or write the user's files, where a
# memory error would do harm: the replay of every fuzz corpus and kept crash input (CSV
# model, SCOR, project and survey readers), the CSV/SCOR/limits readers, the project store
# (read-only, full disk, refused files, kill tests), the ensemble and fieldwork cores, and
# the CLI tests that feed tledger hostile files, read-only projects, full disks and
# SIGKILLs (they run the sanitized tledger). Measured on an idle 2-core machine without
# ccache, the whole pass adds about 18 minutes to CI (DEVELOPERS.md, "Fuzzing, sanitizers
# and limits").
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/../app/bootstrap.sh"
tl_install_missing_packages
tl_build -DTL_BUILD_TESTS=ON
export QT_QPA_PLATFORM="${QT_QPA_PLATFORM:-offscreen}"
(cd "$TL_BUILD_DIR" && ctest --output-on-failure --parallel "$(nproc)" --timeout 900)

sanitize="${TL_RUN_SANITIZERS:-all}"
[ "$sanitize" = 0 ] && exit 0
sanitized_programs=(
  fuzz_csv_model fuzz_scor fuzz_project fuzz_survey
  io_csv_test io_csv_fixtures_test io_scor_test io_limits_test
  read_only_test project_file_test store_limits_test refused_file_handles_test crash_safety_test
  ensemble_test fieldwork_test
  cli_reliability_test cli_bad_input_test cli_limits_test cli_new_commands_reliability_test cli_killed_run_test
)
start=$(date +%s)
cd "$TL_ROOT"
launcher=()
command -v ccache >/dev/null && launcher=(-DCMAKE_CXX_COMPILER_LAUNCHER=ccache)
cmake --preset sanitize "${launcher[@]}" >/dev/null
if [ "$sanitize" != subset ]; then
  echo "== Sanitizer pass (AddressSanitizer + UBSan): every core, CLI and fuzz-replay test"
  cmake --build --preset sanitize --parallel "$(nproc)"
  # The preset leaves out the cross-checks, the benchmark smoke runs and suites named *Large.
  ctest --preset sanitize --parallel "$(nproc)" --timeout 900
else
  echo "== Sanitizer pass (AddressSanitizer + UBSan): ${sanitized_programs[*]}"
  cmake --build --preset sanitize --parallel "$(nproc)" --target "${sanitized_programs[@]}"
  # Tests carry their program's name as a label (tests/CMakeLists.txt); the fuzz replays
  # carry "fuzz".
  labels="$(IFS='|'; echo "${sanitized_programs[*]}")"
  ctest --preset sanitize --parallel "$(nproc)" --timeout 900 -L "^(fuzz|${labels})\$"
fi
echo "== Sanitizer pass took $(( $(date +%s) - start )) s"
