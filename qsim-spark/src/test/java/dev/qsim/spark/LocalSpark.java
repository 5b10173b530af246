package dev.qsim.spark;

import org.apache.spark.sql.SparkSession;

/**
 * The local Spark session of the tests: two cores, no web UI, few shuffle partitions. Test
 * classes share one session per class (start in {@code @BeforeAll}, stop in {@code @AfterAll});
 * the first start in a JVM takes about 3 s, later ones about 0.1 s.
 */
public final class LocalSpark {
    private static SparkSession session;

    private LocalSpark() {
    }

    /**
     * Starts the local session, or returns the running one.
     *
     * @return the session
     */
    public static synchronized SparkSession start() {
        if (session == null) {
            session = SparkSession.builder()
                    .master("local[2]")
                    .appName("qsim-spark tests")
                    .config("spark.ui.enabled", "false")
                    .config("spark.sql.shuffle.partitions", "4")
                    .getOrCreate();
        }
        return session;
    }

    /** Stops the session, if one runs. */
    public static synchronized void stop() {
        if (session != null) {
            session.stop();
            session = null;
        }
    }
}
