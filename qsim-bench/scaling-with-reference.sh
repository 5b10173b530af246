#!/usr/bin/env bash
# Runs ScalingReport with its bandwidth floor from the C reference kernel (shared/ceiling/ceiling.c)
# measured in the same run: builds the C kernel into a temporary directory, then alternates
#   C kernel, report, C kernel, report, ..., C kernel
# so that every report run has a C measurement right before it (its --reference, which the report
# reads before measuring) and right after it. The C runs are 'ceiling gates N REPS' for each n of
# the report and one 'ceiling stream MIB REPS' over as many bytes as the report's Java probe at
# the largest n, on the report's thread count. Writes into OUT: ceiling-R.txt (the C output),
# scaling-R.csv and scaling-R.svg (report run R), and prints for each row the fraction of the C
# dense gate against the C run before (the CSV's fraction_of_reference) and after it.
# Run from anywhere, after
#   mvn -q -B -DskipTests package
# Arguments: ScalingReport options other than --min, --max, --threads, --reference, --csv and
# --svg (default: --kernels dense --targets all --circuit off).
# Environment (all optional):
#   MIN=20 MAX=24  qubit counts     THREADS=1  threads of both     ROUNDS=1  report runs
#   REPS=5         C repetitions    OUT=scaling-reference  folder of the files
#   CEILING_C=...  the C source (default: ../shared/ceiling/ceiling.c beside the repository)
#   JAVA=java      the java launcher; XMX=4g its heap
set -euo pipefail

root=$(cd "$(dirname "$0")/.." && pwd)
min=${MIN:-20}
max=${MAX:-24}
threads=${THREADS:-1}
rounds=${ROUNDS:-1}
reps=${REPS:-5}
out=${OUT:-scaling-reference}
ceiling_c=${CEILING_C:-$root/../shared/ceiling/ceiling.c}
jar=$root/qsim-bench/target/qsim-bench.jar
java=${JAVA:-java}
xmx=${XMX:-4g}

for v in min max threads rounds reps; do
  if ! [[ ${!v} =~ ^[1-9][0-9]{0,2}$ ]]; then
    echo "${v^^} must be a whole number in [1, 999] but was '${!v}'" >&2
    exit 1
  fi
done
if ((min < 4 || max > 34 || min > max)); then
  echo "MIN..MAX must lie in 4..34 (the C kernel's sizes) but was $min..$max" >&2
  exit 1
fi
# shellcheck source=ceiling-common.sh
. "$root/qsim-bench/ceiling-common.sh"
args=("$@")
[ $# -eq 0 ] && args=(--kernels dense --targets all --circuit off)
mkdir -p "$out"

# The Java probe's three arrays of 2^(max+1) doubles, at least 2^24 (HeapBudget), in MiB.
len=$((1 << (max + 1)))
((len < 1 << 24)) && len=$((1 << 24))
stream_mib=$((24 * len >> 20))

ceil() {
  CEILING_THREADS=$threads OMP_NUM_THREADS=$threads "$tmp/ceiling" "$@"
}
measure_c() {
  for ((n = min; n <= max; n++)); do ceil gates $n "$reps"; done > "$1"
  ceil stream "$stream_mib" "$reps" >> "$1"
}
load() { cut -d' ' -f1-3 /proc/loadavg; }

echo "# $(date -u +%FT%TZ) $(uname -n), $(nproc) processors, load average $(load)"
echo "# n = $min..$max, threads $threads, rounds $rounds, C reps $reps, stream $stream_mib MiB;" \
  "report options: ${args[*]}"
echo "# C kernel (round 0, load average $(load))"
measure_c "$out/ceiling-0.txt"
for ((r = 1; r <= rounds; r++)); do
  echo "# report, round $r (load average $(load))"
  "$java" -Xmx"$xmx" -XX:+UseTransparentHugePages --add-modules jdk.incubator.vector \
    -cp "$jar" dev.qsim.bench.ScalingReport --min "$min" --max "$max" --threads "$threads" \
    --reference "$out/ceiling-$((r - 1)).txt" --csv "$out/scaling-$r.csv" \
    --svg "$out/scaling-$r.svg" "${args[@]}"
  echo "# C kernel, round $r (load average $(load))"
  measure_c "$out/ceiling-$r.txt"
  # Each row's GB/s against the C dense gate before (the CSV's column) and after the report.
  awk -F'\t' -v th="threads=$threads" -v r="$r" '
    FNR == 1 { file++ }
    file == 1 && $1 == "test=gate_summary" && $2 == "gate=u" && index("\t" $0 "\t", "\t" th "\t") {
      for (i = 1; i <= NF; i++) { split($i, a, "="); f[a[1]] = a[2] }
      after[f["n"]] = f["median_over_t_gbs"] }
    file == 2 && FNR == 1 { FS = ","; $0 = $0; for (i = 1; i <= NF; i++) col[$i] = i; next }
    file == 2 {
      n = $col["n"]; gb = $col["gb_per_s"]
      printf "round=%d n=%s kernel=%s target=%s precision=%s gb_per_s=%s", r, n, $col["kernel"],
        $col["target"], $col["precision"], gb
      printf " fraction_of_reference=%s (C before %s GB/s)", $col["fraction_of_reference"],
        $col["reference_gb_per_s"]
      if (n in after) printf " after=%.3f (C after %s GB/s)", gb / after[n], after[n]
      printf " fraction_of_copy=%s\n", $col["fraction_of_copy"] }' \
    "$out/ceiling-$r.txt" "$out/scaling-$r.csv"
done
echo "# done (load average $(load)); files in $out"
