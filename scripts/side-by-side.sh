#!/usr/bin/env bash
# side-by-side.sh: VoxProf against the optimised C reference in ../shared/perf, and the other speed ratios
# docs/performance.md reports. Prints ratios only: on a shared machine absolute times say little.
#
# Usage: scripts/side-by-side.sh [ROUNDS]        (default 3 interleaved rounds)
# Environment:
#   VOXPROF_PERF_DIR  the C reference's folder (default: ../shared/perf beside this repository)
#   VOXPROF_PERF_CACHE  where the built reference and the generated scene are kept
#                       (default: ${XDG_CACHE_HOME:-$HOME/.cache}/voxprof-perf)
#   CAMERA, SIZE      camera of the generated scene and image size for the C comparison (default overview, 1280x720)
# Needs: bash, gcc, the .NET SDK. Reads ../shared/perf, never writes there.
#
# What it does:
#  1. builds refbrick.c (-O3 -march=native -ffp-contract=off, as its README says) and genscene.c into the cache, and
#     generates the 1024x256x1024 raw terrain scene there once;
#  2. builds tests/VoxProf.Benchmarks (Release) and publishes the command through ./voxprof;
#  3. VoxProf's dda, dda-mask and hdda against refbrick --mode both, one thread each, interleaved, counting on,
#     per CPU second, each side of a round the fastest of 3 traces (the `side` benchmark); checks both did the same
#     iterations; also runs the reference's own loop written in C# (ReferenceLoop) and prints its ratio to C (what the
#     JIT makes of that loop) and VoxProf's ratio to it (what the kernels cost on top); on a processor with AVX-512,
#     also that loop with eight rays in lockstep (LaneLoop, an experiment) against C;
#  4. the share of a whole `voxprof trace --strategy dda-mask` run's process CPU (2560x1440, the raw scene) spent
#     tracing: CPU seconds of that trace alone on one thread (measured in the benchmark, fastest of 3) over the run's
#     user+system seconds (fastest of 3 runs);
#  5. the published command timed as ../shared/perf/perf_ratio.sh times it, by scripts/perf-ratio.sh (that script adapted
#     to today's report.json): `trace --threads 1 --strategy dda-mask`, report.json's trace seconds, against one
#     `refbrick --mode mask` run's wall trace time, 3 interleaved pairs, with the memory model on (`trace`'s default; its
#     replay of each tile's reads is inside the timed region) and off;
#  6. --prepass 4 against no prepass, dda, every demo camera at 1280x720 (the `prepass` benchmark);
#  7. the start-up of a repeated ./voxprof call.
set -euo pipefail
ROUNDS=${1:-3}
HERE=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)
CAMERA=${CAMERA:-overview}
SIZE=${SIZE:-1280x720}

# 1. The reference, built for this CPU, and the scene.
. "$HERE/scripts/perf-reference.sh"

# 2. VoxProf: the benchmark harness and the published command.
dotnet build "$HERE/tests/VoxProf.Benchmarks" -c Release --nologo -v quiet >/dev/null
BENCH="dotnet $HERE/tests/VoxProf.Benchmarks/bin/Release/net10.0/VoxProf.Benchmarks.dll"
"$HERE/voxprof" --version >/dev/null

echo "machine: $(nproc) cores, $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2 | sed 's/^ *//'), load average $(cut -d' ' -f1-3 /proc/loadavg)"
echo "commit: $(git -C "$HERE" rev-parse --short HEAD 2>/dev/null || echo unknown)"

# 3 and 4 (the trace part): the side benchmark.
echo "== VoxProf against the C reference: camera $CAMERA, $SIZE, one thread, $ROUNDS interleaved rounds"
SIDE=$($BENCH side "$REF" "$SCENE" "$CAMERA" "$SIZE" "$ROUNDS" 2560x1440)
echo "$SIDE" | grep -v '^traversal'
TRAVERSAL=$(echo "$SIDE" | sed -n 's/^traversal cpu seconds .* = //p')

# 4. The whole run, user + system CPU seconds of the published command: the fastest of 3 runs, as the traversal figure
#    is the fastest of 3 traces (a slow spell of the machine only adds time).
OUT=$(mktemp -d "${TMPDIR:-/tmp}/side-by-side.XXXXXX")
trap 'rm -rf "$OUT"' EXIT
TIMEFORMAT='%U %S'
PROCESS=
for i in 1 2 3; do
  RUN=$( { time "$HERE/.build/voxprof/voxprof" trace "$SCENE" --camera "$CAMERA" --size 2560x1440 --strategy dda-mask \
    --quiet --out "$OUT/share$i" >/dev/null 2>&1; } 2>&1 | tail -1)
  PROCESS=$(echo "$RUN" | awk -v best="$PROCESS" '{ t = $1 + $2; print (best == "" || t < best) ? t : best }')
  rm -rf "$OUT/share$i"
done
echo "== share of process CPU in traversal: trace --strategy dda-mask, 2560x1440, $CAMERA of the raw scene"
awk -v t="$TRAVERSAL" -v p="$PROCESS" 'BEGIN { printf "share: %.0f%% (traversal %.2f CPU s of the run'"'"'s %.2f CPU s)\n", 100 * t / p, t, p }'

# 5. The published command, as perf_ratio.sh times it: scripts/perf-ratio.sh, its copy adapted to today's report.json
#    (camera overview, 1280x720, whatever CAMERA and SIZE say), memory model on and off; threshold 0, so it never fails.
echo "== the published command as perf_ratio.sh times it: trace --threads 1 --strategy dda-mask, overview, 1280x720"
VOXPROF_PERF_DIR=$PERF VOXPROF_PERF_CACHE=$CACHE "$HERE/scripts/perf-ratio.sh" "$HERE/.build/voxprof/voxprof" 0 |
  grep -E '^(check|memory model on \(|ratio)'

# 6. The prepass.
echo "== --prepass 4 against no prepass: dda, demo cameras, 1280x720 ($ROUNDS interleaved rounds; wall: both cores, cpu: one thread)"
$BENCH prepass "$HERE/samples/stonebrook-quarry.vpscene.json" 1280x720 4 dda "$ROUNDS" all 0 | cut -d, -f1,4 | sed 's/^/wall /'
$BENCH prepass "$HERE/samples/stonebrook-quarry.vpscene.json" 1280x720 4 dda "$ROUNDS" all 1 | cut -d, -f1,5 | sed 's/^/cpu /'

# 7. Start-up of a repeated call (the command is published already).
echo "== start-up: ./voxprof --version, repeated call"
TIMEFORMAT='%R'
for i in 1 2 3; do { time "$HERE/voxprof" --version >/dev/null; } 2>&1; done | sort -g | sed -n 2p | sed 's/^/seconds (median of 3): /'
