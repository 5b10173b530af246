#!/usr/bin/env bash
# Runs the qsim-spark tool in Spark local mode on this machine:
#   qsim-spark/run-local.sh COMMAND [OPTIONS]     (COMMAND: sweep, batch, trajectories,
#                                                  clifford-decay, speed; --help lists them)
# Build first, from the repository root: mvn -q -B -DskipTests package
# It puts the thin jar and Spark (target/spark-classpath.txt, written by the build) on the class
# path, adds the JVM options Spark needs on Java 17 and later (spark-jvm-options) and quiets
# Spark's log to warnings (log4j2-tool.properties). QSIM_SPARK_HEAP sets the heap (default 4g).
set -euo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
jar="$here/target/qsim-spark.jar"
classpath="$here/target/spark-classpath.txt"
if [[ ! -f "$jar" || ! -f "$classpath" ]]; then
  echo "qsim-spark: build first, from the repository root: mvn -q -B -DskipTests package" >&2
  exit 2
fi
export SPARK_LOCAL_IP="${SPARK_LOCAL_IP:-127.0.0.1}"
exec java "-Xmx${QSIM_SPARK_HEAP:-4g}" @"$here/spark-jvm-options" \
  "-Dlog4j2.configurationFile=$here/log4j2-tool.properties" \
  -cp "$jar:$(cat "$classpath")" dev.qsim.spark.cli.SparkTool "$@"
