# perf-reference.sh: sourced by side-by-side.sh and perf-ratio.sh, so both time the same reference on the same scene.
# Builds ../shared/perf/refbrick.c for this CPU (-O3 -march=native -ffp-contract=off, as its README says; the cached
# binary is keyed by the CPU model) and generates genscene.c's 1024x256x1024 raw terrain once, both in the cache.
# Sets PERF, CACHE, REF and SCENE; honours VOXPROF_PERF_DIR and VOXPROF_PERF_CACHE. Reads ../shared/perf, never writes there.
PERF=${VOXPROF_PERF_DIR:-$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)/../shared/perf}
CACHE=${VOXPROF_PERF_CACHE:-${XDG_CACHE_HOME:-$HOME/.cache}/voxprof-perf}
[ -f "$PERF/refbrick.c" ] && [ -f "$PERF/genscene.c" ] || {
  echo "$(basename "$0"): no refbrick.c and genscene.c in $PERF (set VOXPROF_PERF_DIR)" >&2; exit 2; }
mkdir -p "$CACHE"
CPUKEY=$( (uname -m; grep -m1 'model name' /proc/cpuinfo 2>/dev/null || true) | cksum | cut -d' ' -f1)
REF=$CACHE/refbrick-$CPUKEY
if [ ! -x "$REF" ] || [ "$PERF/refbrick.c" -nt "$REF" ]; then
  gcc -O3 -march=native -ffp-contract=off -o "$REF" "$PERF/refbrick.c" -lm || exit 2
fi
SCENE=$CACHE/scene/terrain.vpscene.json
if [ ! -f "$SCENE" ] || [ "$(stat -c %s "$CACHE/scene/terrain.raw" 2>/dev/null || echo 0)" != 268435456 ] \
   || [ "$PERF/genscene.c" -nt "$SCENE" ]; then
  gcc -O2 -o "$CACHE/genscene" "$PERF/genscene.c" -lm || exit 2
  mkdir -p "$CACHE/scene"
  "$CACHE/genscene" "$CACHE/scene" >/dev/null || exit 2
fi
