#!/usr/bin/env bash
# Sets up a fresh Debian 12 machine (as root) and builds stage, then either
# runs the demo or runs every test. This is what the README's two commands
# and .ci/run call.
#
#   bash cmake/bootstrap.sh demo    install what is missing, build, run the demo
#   bash cmake/bootstrap.sh test    install what is missing, build, run ctest
#
# The HTML report's plotting library (Vega, Vega-Lite, vega-embed) comes from
# the npm registry at the versions pinned in report-bundles/package-lock.json,
# installed there with Debian's nodejs and npm; the test mode also installs
# Debian's chromium for the report's browser test.
set -euo pipefail

mode="${1:-}"
if [[ "$mode" != demo && "$mode" != test ]]; then
  echo "usage: bash cmake/bootstrap.sh demo|test" >&2
  exit 2
fi

root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
build="${STAGE_BUILD_DIR:-$root/build}"

packages=(cmake ninja-build g++ pkg-config libeigen3-dev libsuitesparse-dev libboost-dev
          libspdlog-dev libgtest-dev libgmock-dev libbenchmark-dev libcli11-dev nlohmann-json3-dev)
[[ "$mode" == test ]] && packages+=(chromium)
# Node.js and npm, unless some are installed already (another packaging of
# Node brings its own npm, which Debian's npm package would conflict with).
command -v node >/dev/null && command -v npm >/dev/null || packages+=(nodejs npm)
missing=()
for p in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if ((${#missing[@]})); then
  echo "== installing: ${missing[*]}"
  apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends "${missing[@]}"
fi

# The plotting bundles, again only when the lock file has changed since.
bundles="$root/report-bundles"
if ! cmp -s "$bundles/package-lock.json" "$bundles/node_modules/.stage-installed-lock" 2>/dev/null; then
  echo "== installing the report's plotting bundles (npm ci in $bundles)"
  (cd "$bundles" && npm ci --no-audit --no-fund --ignore-scripts --loglevel=error)
  cp "$bundles/package-lock.json" "$bundles/node_modules/.stage-installed-lock"
fi

# Warnings are errors in CI; elsewhere a newer compiler's new warning should
# not stop a user's build.
werror=OFF
[[ -n "${CI:-}" ]] && werror=ON
cmake -S "$root" -B "$build" -G Ninja -DCMAKE_BUILD_TYPE=Release \
      -DSTAGE_WARNINGS_AS_ERRORS="$werror" -DSTAGE_BUILD_BENCHMARKS="$([[ $mode == test ]] && echo ON || echo OFF)"
jobs="$(nproc)"

if [[ "$mode" == demo ]]; then
  cmake --build "$build" --target stage -j "$jobs"
  exec bash "$root/apps/examples/demo.sh" "$build/apps/stage" "$build/demo-reports"
fi

cmake --build "$build" -j "$jobs"
cd "$build"
ctest --output-on-failure -j "$jobs"
