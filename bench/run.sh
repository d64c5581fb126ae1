#!/usr/bin/env bash
# Whole-process timing of pare's phases on synthetic receiver banks
# (internal/synth), and of `pare sweep` against ngspice on an RC ladder.
#
#   bash bench/run.sh [SIZES] [PHASES]
#   SIZES  parts per bank, comma-separated (default 100,1000,10000)
#   PHASES of load,reduce,proof,verify,stages,draw,main (default all);
#          reduce is `reduce --check=false`: the reduction with no step proven;
#          proof is `reduce`, which proves every step as the main job does,
#          without drawing (verify and stages prove the steps too)
#   PARE_BENCH_BIN      time this pare binary instead of building the worktree's
#   PARE_BENCH_TIMEOUT  seconds before a run is given up (default 600)
#   PARE_BENCH_LADDER   RC ladder sections for the sweep pairing (default 10000; 0 skips)
#   PARE_BENCH_BASE     a pare binary from before a change, timed beside pare and
#                       ngspice in each round of the sweep pairing
#   PARE_BENCH_ROUNDS   rounds of the sweep pairing (default 5)
#
# For each size and phase it prints the wall time, the time per part, the
# peak resident memory, the time as a multiple of the load of the same file
# (`pare check`), and the growth exponent log(t2/t1)/log(n2/n1) against the
# size before, and the CPU time (user + system) beside the wall time, which
# on a shared machine counts waiting for a core. Each phase is a whole `pare` process, so every figure
# includes loading the file. The machine is shared: run it when it is quiet,
# or read the ratios rather than the seconds.
#
# Last it says whether issue 13's targets are met, from the rows above: the
# main job at the size nearest 1,000 parts under 2 s and at most 20 times
# its load, every phase's growth exponent at most 1.2 between the sizes
# nearest 1,000 and 10,000 parts, and every phase under 300 MB at the size
# nearest 10,000 (a target whose sizes were not run is left out).
set -u
sizes=${1:-100,1000,10000}
phases=${2:-load,reduce,proof,verify,stages,draw,main}
limit=${PARE_BENCH_TIMEOUT:-600}
ladder=${PARE_BENCH_LADDER:-10000}
root=$(cd "$(dirname "$0")/.." && pwd)
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
(cd "$root" && go build -o "$work/pare" ./cmd/pare && go build -o "$work/gen" ./bench/gen) || exit 2
if [ -n "${PARE_BENCH_BIN:-}" ]; then cp "$PARE_BENCH_BIN" "$work/pare" || exit 2; fi

# run NAME FILE ARGS...: prints "seconds peakKB cpuseconds" or "timeout".
run() {
	local out=$work/time.txt
	if ! /usr/bin/time -f '%e %M %U %S' -o "$out" timeout "$limit" "$work/pare" "$@" >/dev/null 2>"$work/err.txt"; then
		if grep -q 'Command exited with non-zero status 124' "$out" 2>/dev/null; then
			echo timeout
			return
		fi
	fi
	tail -n 1 "$out" | awk '{ printf "%s %s %.2f\n", $1, $2, $3 + $4 }'
}

args_of() { # phase file
	case $1 in
	load) echo "check $2" ;;
	reduce) echo "reduce $2 --check=false -o $work/r.toml" ;;
	proof) echo "reduce $2 -o $work/r.toml" ;;
	verify) echo "verify $2" ;;
	stages) echo "stages $2" ;;
	draw) echo "draw $2 -o $work/d.svg" ;;
	main) echo "$2 -o $work/out" ;;
	esac
}

echo "# $(uname -m), $(nproc) cores, $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2 | sed 's/^ //'), load $(cut -d' ' -f1-3 /proc/loadavg)"
printf '%-7s %-7s %10s %10s %12s %9s %9s %7s\n' phase parts seconds cpu-s "µs/part" peakMB "×load" growth
declare -A prev_t prev_n
for n in ${sizes//,/ }; do
	f=$work/bank$n.toml
	"$work/gen" -parts "$n" -seed 1 >"$f"
	parts=$(grep -c '^[A-Z][A-Za-z0-9]* = {' "$f")
	load=""
	for ph in ${phases//,/ }; do
		# shellcheck disable=SC2046
		r=$(run $(args_of "$ph" "$f"))
		if [ "$r" = timeout ]; then
			printf '%-7s %-7s %10s\n' "$ph" "$parts" ">$limit"
			continue
		fi
		read -r t kb cpu <<<"$r"
		[ "$ph" = load ] && load=$t
		awk -v ph="$ph" -v n="$parts" -v t="$t" -v cpu="$cpu" -v kb="$kb" -v load="$load" -v pt="${prev_t[$ph]:-}" -v pn="${prev_n[$ph]:-}" 'BEGIN {
			ratio = (load > 0) ? sprintf("%.1f", t / load) : "-"
			g = (pt > 0 && t > 0 && pn > 0 && n != pn) ? sprintf("%.2f", log(t / pt) / log(n / pn)) : "-"
			printf "%-7s %-7d %10.2f %10.2f %12.1f %9.1f %9s %7s\n", ph, n, t, cpu, 1e6 * t / n, kb / 1024, ratio, g
		}'
		prev_t[$ph]=$t
		prev_n[$ph]=$parts
		echo "$ph $parts $t $kb $load" >>"$work/rows.txt"
	done
done

# targets: issue 13's bounds read from the rows (phase parts seconds KB load)
if [ -s "$work/rows.txt" ]; then
	echo "# issue 13's targets"
	awk 'function near(n, want) { return (n > want / 2 && n < want * 2) }
	{ ph[NR] = $1; n[NR] = $2; t[NR] = $3; kb[NR] = $4; ld[NR] = $5 }
	END {
		for (i = 1; i <= NR; i++) {
			if (ph[i] == "main" && near(n[i], 1000))
				printf "main job at %d parts: %.2f s (target < 2 s: %s), %.1f x its load (target <= 20: %s)\n", n[i], t[i], (t[i] < 2) ? "met" : "NOT met", (ld[i] > 0) ? t[i] / ld[i] : 0, (ld[i] > 0 && t[i] / ld[i] <= 20) ? "met" : "NOT met"
			if (near(n[i], 10000)) {
				printf "%-7s at %d parts: %.0f MB (target < 300 MB: %s)\n", ph[i], n[i], kb[i] / 1024, (kb[i] / 1024 < 300) ? "met" : "NOT met"
				for (j = 1; j <= NR; j++)
					if (ph[j] == ph[i] && near(n[j], 1000) && t[j] > 0) {
						g = log(t[i] / t[j]) / log(n[i] / n[j])
						printf "%-7s growth %d -> %d parts: %.2f (target <= 1.2: %s)\n", ph[i], n[j], n[i], g, (g <= 1.2) ? "met" : "NOT met"
					}
			}
		}
	}' "$work/rows.txt"
fi

if [ "$ladder" -gt 0 ] && command -v ngspice >/dev/null; then
	"$work/gen" -ladder "$ladder" >"$work/ladder.toml"
	"$work/pare" spice "$work/ladder.toml" -o "$work/ladder.cir" >/dev/null
	echo "# RC ladder, $ladder sections: whole processes, paired (pare sweep 101 points; ngspice -b on pare's own deck); CPU is user + system"
	# timed NAME CMD...: prints "NAME wall W s, cpu C s, peak M MB".
	timed() {
		local name=$1
		shift
		/usr/bin/time -f '%e %U %S %M' -o "$work/pair.txt" "$@" >/dev/null 2>&1
		awk -v n="$name" '{ printf "%s wall %.2f s, cpu %.2f s, peak %.0f MB", n, $1, $2 + $3, $4 / 1024 }' "$work/pair.txt"
	}
	for i in $(seq "${PARE_BENCH_ROUNDS:-5}"); do
		b=""
		if [ -n "${PARE_BENCH_BASE:-}" ]; then
			b="$(timed base "$PARE_BENCH_BASE" sweep "$work/ladder.toml"); "
		fi
		p=$(timed pare "$work/pare" sweep "$work/ladder.toml")
		s=$(cd "$work" && timed ngspice ngspice -b ladder.cir)
		echo "pair $i (load $(cut -d' ' -f1 /proc/loadavg)): $b$p; $s"
	done
fi
