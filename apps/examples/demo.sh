#!/usr/bin/env bash
# The README's demo: a follower that looks fine on paper clips early into a
# 32 ohm load; a push-pull pair on the same rails and load swings volts, once
# bias removes its crossover distortion. Usage: demo.sh PATH/TO/stage
set -euo pipefail
stage="$1"
here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"

banner() { printf '\n==== %s\n\n' "$1"; }

banner "1. Emitter follower into 32 Ω: gain near one, output impedance a few ohms, yet ..."
"$stage" run "$here/follower_32ohm.stage"

banner "2. Class-B push-pull, same rails and load, 1 V peak drive: crossover distortion"
"$stage" run "$here/push_pull_class_b.stage"

banner "3. Class-AB push-pull (two bias diodes): low-level distortion gone; headroom and efficiency"
"$stage" run "$here/push_pull_class_ab.stage"
