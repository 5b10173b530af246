# Shared by ceiling-compare.sh and scaling-with-reference.sh (sourced, not run): checks that the
# benchmark jar and the C reference kernel exist, then compiles the kernel into a temporary
# folder removed on exit. Expects $jar and $ceiling_c; sets $tmp (the folder, with
# $tmp/ceiling the compiled kernel).
if [ ! -f "$jar" ]; then
  echo "no $jar: build it first with  mvn -q -B -DskipTests package" >&2
  exit 1
fi
if [ ! -f "$ceiling_c" ]; then
  echo "no C reference kernel at $ceiling_c; set CEILING_C" >&2
  exit 1
fi
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
gcc -std=gnu11 -O3 -march=native -fopenmp "$ceiling_c" -o "$tmp/ceiling" -lm
