#!/usr/bin/env bash
# The README's demo: a follower that looks fine on paper clips early into a
# 32 ohm load; a push-pull pair on the same rails and load swings volts, once
# bias removes its crossover distortion. Each example also writes its HTML
# report (charts of every analysis, opens offline) into REPORTS.
# Usage: demo.sh PATH/TO/stage [REPORTS, default demo-reports/ beside the build's apps/]
set -euo pipefail
stage="$1"
here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
reports="${2:-$(cd "$(dirname "$stage")/.." && pwd)/demo-reports}"

banner() { printf '\n==== %s\n\n' "$1"; }

banner "1. Emitter follower into 32 Ω: gain near one, output impedance a few ohms, yet ..."
"$stage" run "$here/follower_32ohm.stage" --report "$reports/follower_32ohm.html"

banner "2. Class-B push-pull, same rails and load, 1 V peak drive: crossover distortion"
"$stage" run "$here/push_pull_class_b.stage" --report "$reports/push_pull_class_b.html"

banner "3. Class-AB push-pull (two bias diodes): low-level distortion gone; headroom and efficiency"
"$stage" run "$here/push_pull_class_ab.stage" --report "$reports/push_pull_class_ab.html"

banner "Reports with the charts of every analysis (open in a browser; they work offline)"
for name in follower_32ohm push_pull_class_b push_pull_class_ab; do
  echo "  $reports/$name.html"
done
