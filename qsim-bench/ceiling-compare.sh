#!/usr/bin/env bash
# Compares qsim with the C reference kernel (shared/ceiling/ceiling.c), back to back on this
# machine: builds the C kernel into a temporary directory, then runs both, alternating which goes
# first, for several rounds, and prints each round's ratios (qsim / C, above 1 means qsim is
# faster) and the median of each ratio over the rounds. Run from anywhere, after
#   mvn -q -B -DskipTests package
# Environment (all optional):
#   ROUNDS=3       rounds
#   REPS=5         repetitions of each gate at 24 and 26 qubits (C: median of REPS)
#   ITEMS="..."    which items to run, any of: big big-all cache single threads circuit
#   CEILING_C=...  the C source (default: ../shared/ceiling/ceiling.c beside the repository)
#   JAVA=java      the java launcher; XMX=4g its heap
#   JAVA_OPTS=...  more options for qsim's JVM (split at spaces), e.g.
#                  -Djdk.incubator.vector.VECTOR_ACCESS_OOB_CHECK=0 (see docs/decisions.md)
# Items (one thread unless said; rates count 32 bytes per amplitude per gate, as the C kernel):
#   big       dense gate at 26 qubits, median over every target (and the worst target's ratio)
#   big-all   the same on every processor
#   cache     dense gate at 14..18 qubits (in cache), median over targets, per size
#   single    qsim single against double precision at 26 qubits (time ratio)
#   threads   qsim 2 threads against 1 at 16 qubits (C's own ratio printed beside)
#   circuit   the 20-layer circuit at 24 qubits through Simulator, against C's dense gate time
#             at 24 qubits times the circuit's gate count
# qsim runs with --add-modules jdk.incubator.vector (the vector kernels) and
# -XX:+UseTransparentHugePages (the C kernel asks for huge pages too).
set -euo pipefail

root=$(cd "$(dirname "$0")/.." && pwd)
rounds=${ROUNDS:-3}
reps=${REPS:-5}
items=${ITEMS:-"big big-all cache single threads circuit"}
ceiling_c=${CEILING_C:-$root/../shared/ceiling/ceiling.c}
jar=$root/qsim-bench/target/qsim-bench.jar
java=${JAVA:-java}
xmx=${XMX:-4g}
read -r -a java_opts <<< "${JAVA_OPTS:-}"
cores=$(nproc)

# shellcheck source=ceiling-common.sh
. "$root/qsim-bench/ceiling-common.sh"

qsim() {
  "$java" -Xmx"$xmx" -XX:+UseTransparentHugePages --add-modules jdk.incubator.vector \
    ${java_opts[@]+"${java_opts[@]}"} -cp "$jar" dev.qsim.bench.GateRate "$@" 2>/dev/null
}
ceil() {
  local t=$1
  shift
  CEILING_THREADS=$t OMP_NUM_THREADS=${t##*,} "$tmp/ceiling" "$@"
}
# value KEY FILE FILTER: the value of KEY on the first line of FILE that contains all the
# tab-separated words of FILTER (e.g. "test=gate_summary gate=u threads=1").
value() {
  awk -v k="$1" -v f="$3" -F'\t' '
    BEGIN { n = split(f, w, " ") }
    { ok = 1; for (i = 1; i <= n; i++) if (index("\t" $0 "\t", "\t" w[i] "\t") == 0) ok = 0
      if (!ok) next
      for (i = 1; i <= NF; i++) { split($i, a, "="); if (a[1] == k) { print a[2]; exit } } }' "$2"
}
ratio() { awk -v a="$1" -v b="$2" 'BEGIN { printf "%.3f", a / b }'; }
# worst TARGET ratio of qsim's and C's per-target rates at the given thread count
worst() {
  awk -F'\t' -v th="threads=$3" '
    function get(k,  i, a) { for (i = 1; i <= NF; i++) { split($i, a, "="); if (a[1] == k) return a[2] } }
    FNR == 1 { file++ }
    $1 == "test=gate" && index($0, "gate=u") && (index($0, "variant=fast") || file == 2) && index("\t" $0 "\t", "\t" th "\t") {
      if (file == 1) c[get("t")] = get("gbs"); else q[get("t")] = get("gbs") }
    END { m = 1e9; for (t in q) if (t in c && q[t] / c[t] < m) m = q[t] / c[t]; printf "%.3f", m }' "$1" "$2"
}
record() { echo "$1" >> "$tmp/ratios"; echo "  $1"; }

echo "# $(date -u +%FT%TZ) $(uname -n), $cores processors, load average $(cut -d' ' -f1-3 /proc/loadavg)"
echo "# cpu: $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2 | sed 's/^ //')"
echo "# java: $("$java" -version 2>&1 | head -1); qsim: $(qsim gates 4 1 | head -1 | sed 's/^# //')"
echo "# rounds=$rounds reps=$reps items: $items"

for ((r = 1; r <= rounds; r++)); do
  echo "round $r (load average $(cut -d' ' -f1-3 /proc/loadavg)):"
  first=c
  ((r % 2 == 0)) && first=q
  for item in $items; do
    case $item in
      big | big-all)
        t=1
        [ "$item" = big-all ] && t=$cores
        if [ $first = c ]; then ceil $t gates 26 "$reps" > "$tmp/c"; qsim gates 26 "$reps" $t > "$tmp/q"
        else qsim gates 26 "$reps" $t > "$tmp/q"; ceil $t gates 26 "$reps" > "$tmp/c"; fi
        c=$(value median_over_t_gbs "$tmp/c" "test=gate_summary gate=u threads=$t")
        q=$(value median_over_t_gbs "$tmp/q" "test=gate_summary")
        record "item=$item n=26 threads=$t c_gbs=$c qsim_gbs=$q ratio=$(ratio "$q" "$c") worst_target_ratio=$(worst "$tmp/c" "$tmp/q" $t)"
        ;;
      cache)
        for n in 14 15 16 17 18; do
          if [ $first = c ]; then ceil 1 gates $n 50 > "$tmp/c"; qsim gates $n 50 1 > "$tmp/q"
          else qsim gates $n 50 1 > "$tmp/q"; ceil 1 gates $n 50 > "$tmp/c"; fi
          c=$(value median_over_t_gbs "$tmp/c" "test=gate_summary gate=u threads=1")
          q=$(value median_over_t_gbs "$tmp/q" "test=gate_summary")
          record "item=cache-$n n=$n threads=1 c_gbs=$c qsim_gbs=$q ratio=$(ratio "$q" "$c")"
        done
        ;;
      single)
        if [ $first = c ]; then qsim gates 26 "$reps" 1 double > "$tmp/d"; qsim gates 26 "$reps" 1 single > "$tmp/s"
        else qsim gates 26 "$reps" 1 single > "$tmp/s"; qsim gates 26 "$reps" 1 double > "$tmp/d"; fi
        d=$(value median_over_t_ns_per_amp "$tmp/d" "test=gate_summary")
        s=$(value median_over_t_ns_per_amp "$tmp/s" "test=gate_summary")
        record "item=single n=26 threads=1 double_ns_per_amp=$d single_ns_per_amp=$s ratio=$(ratio "$d" "$s")"
        ;;
      threads)
        if [ $first = c ]; then ceil 1,2 gates 16 50 > "$tmp/c"; qsim gates 16 50 1 > "$tmp/q1"; qsim gates 16 50 2 > "$tmp/q2"
        else qsim gates 16 50 2 > "$tmp/q2"; qsim gates 16 50 1 > "$tmp/q1"; ceil 1,2 gates 16 50 > "$tmp/c"; fi
        c1=$(value median_over_t_gbs "$tmp/c" "test=gate_summary gate=u threads=1")
        c2=$(value median_over_t_gbs "$tmp/c" "test=gate_summary gate=u threads=2")
        q1=$(value median_over_t_gbs "$tmp/q1" "test=gate_summary")
        q2=$(value median_over_t_gbs "$tmp/q2" "test=gate_summary")
        record "item=threads n=16 qsim_1t_gbs=$q1 qsim_2t_gbs=$q2 ratio=$(ratio "$q2" "$q1") c_ratio=$(ratio "$c2" "$c1")"
        ;;
      circuit)
        if [ $first = c ]; then ceil 1 gates 24 "$reps" > "$tmp/c"; qsim circuit 24 3 1 > "$tmp/q"
        else qsim circuit 24 3 1 > "$tmp/q"; ceil 1 gates 24 "$reps" > "$tmp/c"; fi
        nspa=$(value median_over_t_ns_per_amp "$tmp/c" "test=gate_summary gate=u threads=1")
        gates=$(value gates "$tmp/q" "test=circuit")
        qs=$(value median_s "$tmp/q" "test=circuit")
        cs=$(awk -v a="$nspa" -v g="$gates" 'BEGIN { printf "%.3f", a * 16777216 * g / 1e9 }')
        record "item=circuit n=24 threads=1 gates=$gates c_gate_by_gate_s=$cs qsim_s=$qs ratio=$(ratio "$cs" "$qs")"
        ;;
      *)
        echo "unknown item '$item' (allowed: big big-all cache single threads circuit)" >&2
        exit 1
        ;;
    esac
  done
done

echo "medians over $rounds round(s) (load average now $(cut -d' ' -f1-3 /proc/loadavg)):"
awk '{ for (i = 1; i <= NF; i++) { split($i, a, "="); f[a[1]] = a[2] }
       it = f["item"]; if (!(it in seen)) { seen[it] = 1; order[++k] = it }
       r[it] = r[it] " " f["ratio"]; if ("worst_target_ratio" in f) w[it] = w[it] " " f["worst_target_ratio"]
       delete f }
     function med(s,  v, n, i, j, t) { n = split(s, v, " ")
       for (i = 1; i <= n; i++) for (j = i + 1; j <= n; j++) if (v[j] + 0 < v[i] + 0) { t = v[i]; v[i] = v[j]; v[j] = t }
       return n % 2 ? v[(n + 1) / 2] : (v[n / 2] + v[n / 2 + 1]) / 2 }
     END { for (i = 1; i <= k; i++) { it = order[i]
       printf "  %-10s median ratio %.3f  (rounds:%s)", it, med(r[it]), r[it]
       if (it in w) printf "  worst target: median %.3f", med(w[it])
       printf "\n" } }' "$tmp/ratios"
