#!/usr/bin/env bash
# Whole-process timing of the main job on the flagship example, the job
# issue 17 bounds (under 2 s wall on two cores):
#
#   bash bench/flagship.sh [RUNS]
#   RUNS             runs to take the best of (default 5)
#   PARE_BENCH_BIN   time this pare binary instead of building the worktree's
#   PARE_BENCH_BASE  also time this binary, run for run beside the first
#                    (before/after on the same load)
#
# It prints every run's wall and CPU (user + system) time and the best of
# each: the machine is shared, and the best run is the one least slowed by
# the neighbours. Each run writes the whole pack (reduced netlist, sheets,
# notes.md, notes.html) into a scratch folder.
set -u
runs=${1:-5}
root=$(cd "$(dirname "$0")/.." && pwd)
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
if [ -n "${PARE_BENCH_BIN:-}" ]; then
	cp "$PARE_BENCH_BIN" "$work/pare" || exit 2
else
	(cd "$root" && go build -o "$work/pare" ./cmd/pare) || exit 2
fi
bins=(pare)
if [ -n "${PARE_BENCH_BASE:-}" ]; then
	cp "$PARE_BENCH_BASE" "$work/base" || exit 2
	bins=(base pare)
fi
echo "# $(uname -m), $(nproc) cores, $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2 | sed 's/^ //'), load $(cut -d' ' -f1-3 /proc/loadavg)"
declare -A best_wall best_cpu
for i in $(seq "$runs"); do
	for b in "${bins[@]}"; do
		/usr/bin/time -f '%e %U %S' -o "$work/time.txt" "$work/$b" "$root/examples/club-receiver.toml" -o "$work/out-$b" >/dev/null 2>"$work/err.txt" || {
			cat "$work/err.txt" >&2
			exit 1
		}
		read -r wall user sys <"$work/time.txt"
		cpu=$(echo "$user $sys" | awk '{ printf "%.2f", $1 + $2 }')
		printf '%-4s run %d: %5.2f s wall %5.2f s CPU\n' "$b" "$i" "$wall" "$cpu"
		if [ -z "${best_wall[$b]:-}" ] || awk "BEGIN { exit !($wall < ${best_wall[$b]}) }"; then best_wall[$b]=$wall; fi
		if [ -z "${best_cpu[$b]:-}" ] || awk "BEGIN { exit !($cpu < ${best_cpu[$b]}) }"; then best_cpu[$b]=$cpu; fi
	done
done
for b in "${bins[@]}"; do
	printf '%-4s best of %d: %5.2f s wall %5.2f s CPU\n' "$b" "$runs" "${best_wall[$b]}" "${best_cpu[$b]}"
done
echo "# load $(cut -d' ' -f1-3 /proc/loadavg)"
