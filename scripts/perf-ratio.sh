#!/usr/bin/env bash
# perf-ratio.sh VOXPROF [THRESHOLD]: ../shared/perf/perf_ratio.sh adapted to today's report.json, as its README asks
# when the field names change. Single-thread speed of `voxprof trace --strategy dda-mask` against refbrick --mode mask
# (optimised C doing the same iterations on the same tree) on the generated raw terrain, camera overview, 1280x720.
#
# The same measure as the original: VoxProf's time is report.json's trace seconds (start-up, loading, the tree build
# and report writing excluded), the C reference's its own trace time, 3 interleaved pairs (A B B A A B), the ratio the
# median of the pairwise ratios. What differs:
#  - the check that both did the same work reads `iterations.total` (the counter's total moved there);
#  - it is measured twice, with the memory model on (`trace`'s default, added after the original was written: the
#    kernels then also record each node read, which the trace seconds include; the model's replay of the reads is
#    timed apart, as report.json's memory seconds) and off. The C reference models no memory. The last line, and the
#    exit status, are the model-off ratio: the same work as the reference.
# Last line: "ratio: voxprof/C rays per second = 0.NN (voxprof X M rays/s, C Y M rays/s)".
# Exit 0 when that ratio >= THRESHOLD (default 0.5), 1 when below, 2 on a usage or tool error.
# Environment: VOXPROF_PERF_DIR (refbrick.c and genscene.c; default ../shared/perf beside this repository),
# VOXPROF_PERF_CACHE (the built reference and scene; default ${XDG_CACHE_HOME:-$HOME/.cache}/voxprof-perf).
# Needs bash, gcc, awk. Wall-clock figures: on a shared machine quote the ratio only.
set -euo pipefail
VOXPROF=${1:?usage: perf-ratio.sh VOXPROF_BINARY [THRESHOLD]}
THRESHOLD=${2:-0.5}
HERE=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
CAMERA=overview
SIZE=1280x720
PIXELS=921600
[ -x "$VOXPROF" ] || { echo "perf-ratio: $VOXPROF is not executable" >&2; exit 2; }

# The reference built for this CPU (keyed by its model, as the original does) and the scene, both cached.
. "$HERE/scripts/perf-reference.sh"
OUT=$(mktemp -d "${TMPDIR:-/tmp}/perf-ratio.XXXXXX")
trap 'rm -rf "$OUT"' EXIT

run_voxprof() { # MEMORY: prints rays_per_s iterations
  "$VOXPROF" trace "$SCENE" --camera $CAMERA --size $SIZE --threads 1 --strategy dda-mask --counters iterations \
    --memory "$1" --quiet --out "$OUT/vp" >/dev/null || { echo "perf-ratio: voxprof trace failed" >&2; exit 2; }
  awk -v px=$PIXELS '
    /"iterations\.total":/ { if (it == "") { it = $0; sub(/.*: */, "", it); sub(/,.*/, "", it) } }
    /"traceSeconds"/ { getline; sub(/.*: */, ""); sub(/,.*/, ""); s = $0 }
    END { if (s == "" || s + 0 <= 0) exit 1; printf "%.6f %s\n", px / s, it }' "$OUT/vp/report.json" \
    || { echo "perf-ratio: no trace time in report.json" >&2; exit 2; }
}
run_c() { # prints rays_per_s iterations (wall clock, the same clock as VoxProf's trace seconds)
  "$REF" --scene "$SCENE" --camera $CAMERA --size $SIZE --mode mask --quiet |
    awk -v px=$PIXELS '/^refbrick/ { for (i = 1; i <= NF; i++) { if ($i == "trace") w = $(i + 1); if ($i == "iterations") it = $(i + 1) } }
      END { if (w + 0 <= 0) exit 1; printf "%.6f %s\n", px / w, it }' || { echo "perf-ratio: refbrick failed" >&2; exit 2; }
}
med() { printf '%s\n' "$@" | sort -g | sed -n 2p; }
mega() { awk -v a="$1" 'BEGIN { printf "%.2f", a / 1e6 }'; }

RATIO=
for memory in on off; do
  V=() C=() R=() VIT="" CIT=""
  for i in 0 1 2; do
    if [ $((i % 2)) -eq 0 ]; then read -r v vit < <(run_voxprof $memory); read -r c cit < <(run_c)
    else read -r c cit < <(run_c); read -r v vit < <(run_voxprof $memory); fi
    V+=("$v"); C+=("$c"); VIT=$vit; CIT=$cit
    R+=("$(awk -v a="$v" -v b="$c" 'BEGIN { printf "%.6f", a / b }')")
    printf 'memory model %s, pair %d: voxprof %s M rays/s, C %s M rays/s, ratio %.3f\n' $memory $((i + 1)) \
      "$(mega "$v")" "$(mega "$c")" "${R[$i]}"
  done
  if [ "$VIT" = "$CIT" ]; then
    echo "check: same work, $VIT iterations in both (dda-mask and refbrick mask)"
  else
    echo "check: WARNING iterations differ (voxprof $VIT, C $CIT): the tree or the algorithm changed, the ratio compares unequal work"
  fi
  RATIO=$(med "${R[@]}")
  LINE=$(printf 'voxprof/C rays per second = %.2f (voxprof %s M rays/s, C %s M rays/s)' "$RATIO" "$(mega "$(med "${V[@]}")")" "$(mega "$(med "${C[@]}")")")
  if [ $memory = on ]; then echo "memory model on (trace's default): $LINE"; else echo "ratio: $LINE"; fi
done
awk -v r="$RATIO" -v t="$THRESHOLD" 'BEGIN { exit !(r >= t) }'
