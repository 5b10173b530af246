package dev.qsim.spark;

import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.NoSuchElementException;
import java.util.function.LongFunction;

import org.apache.spark.Partitioner;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.sql.SparkSession;

/**
 * Splitting a job's items {@code 0 .. n-1} into contiguous slices, one per partition, and the
 * checks every job shares. Items are seeded by index ({@link ItemSeeds}), so how they are
 * split changes nothing in the results.
 */
final class Slices {
    /** The most shots per item: {@value}. */
    static final int MAX_SHOTS = 10_000_000;

    /** The most partitions a job may ask for: {@value}. */
    static final int MAX_PARTITIONS = 1 << 20;

    private Slices() {
    }

    /**
     * Returns {@code partitions} slices {@code [from, to)} of {@code [0, n)}: slice {@code k}
     * is {@code [k n / p, (k + 1) n / p)}; some are empty when {@code p > n}.
     */
    static List<long[]> of(long n, int partitions) {
        List<long[]> out = new ArrayList<>(partitions);
        for (int k = 0; k < partitions; k++) {
            out.add(new long[] {bound(n, partitions, k), bound(n, partitions, k + 1)});
        }
        return out;
    }

    /** {@code floor(k n / p)} without overflow for {@code n < 2^63}, {@code k <= p < 2^31}. */
    static long bound(long n, int p, int k) {
        return (n / p) * k + (n % p) * k / p;
    }

    /**
     * Tasks per core when the partition count is left to the job: {@value}, the "2-3 tasks per
     * CPU core" of Spark's tuning guide (Apache Spark documentation, "Tuning Spark", section
     * "Level of Parallelism"), so that items of unequal cost balance over the cores.
     */
    static final int TASKS_PER_CORE = 3;

    /**
     * The partitions to use: the given count, or for 0 {@value #TASKS_PER_CORE} per core of
     * Spark's default parallelism, at most one per item (and at least 1).
     */
    static int partitions(SparkSession spark, int asked, long items) {
        return asked > 0 ? asked : defaultPartitions(spark.sparkContext().defaultParallelism(),
                items);
    }

    /** {@value #TASKS_PER_CORE} partitions per core, at most one per item, at least one. */
    static int defaultPartitions(int cores, long items) {
        long p = Math.min((long) TASKS_PER_CORE * Math.max(1, cores), items);
        return (int) Math.max(1, Math.min(p, MAX_PARTITIONS));
    }

    /** Checks a partition count: 0 (the job's choice) or 1 to {@value #MAX_PARTITIONS}. */
    static int requirePartitions(int partitions) {
        if (partitions < 0 || partitions > MAX_PARTITIONS) {
            throw new IllegalArgumentException("the partition count must be 0 (three per core,"
                    + " chosen by the job) or from 1 to " + MAX_PARTITIONS + " but was "
                    + partitions);
        }
        return partitions;
    }

    /** Checks a thread count per task: 1 to 256. */
    static int requireThreads(int threads) {
        if (threads < 1 || threads > 256) {
            throw new IllegalArgumentException("the threads per task must be from 1 to 256 but"
                    + " was " + threads);
        }
        return threads;
    }

    /**
     * Returns the results of the items of the given slices, computed one by one as they are
     * read (a partition's rows are never all held at once).
     */
    static <T> Iterator<T> items(Iterator<long[]> slices, LongFunction<T> item) {
        return new Iterator<T>() {
            private long next;
            private long end;

            @Override
            public boolean hasNext() {
                while (next >= end && slices.hasNext()) {
                    long[] s = slices.next();
                    next = s[0];
                    end = s[1];
                }
                return next < end;
            }

            @Override
            public T next() {
                if (!hasNext()) {
                    throw new NoSuchElementException();
                }
                return item.apply(next++);
            }
        };
    }

    /** The Java face of the session's context. */
    static JavaSparkContext context(SparkSession spark) {
        return JavaSparkContext.fromSparkContext(spark.sparkContext());
    }

    /**
     * Sends item {@code i} of {@code n} to the partition of its slice, so that a keyed RDD is
     * split exactly as {@link #of(long, int)} splits the indices.
     */
    static final class ByIndex extends Partitioner {
        private static final long serialVersionUID = 1L;
        private final long n;
        private final int partitions;

        ByIndex(long n, int partitions) {
            this.n = n;
            this.partitions = partitions;
        }

        @Override
        public int numPartitions() {
            return partitions;
        }

        @Override
        public int getPartition(Object key) {
            long i = (Long) key;
            // The largest k with bound(k) <= i; start from the estimate and correct.
            int k = (int) Math.min(partitions - 1, (i * (double) partitions) / Math.max(1, n));
            while (k > 0 && bound(n, partitions, k) > i) {
                k--;
            }
            while (k < partitions - 1 && bound(n, partitions, k + 1) <= i) {
                k++;
            }
            return k;
        }
    }
}
