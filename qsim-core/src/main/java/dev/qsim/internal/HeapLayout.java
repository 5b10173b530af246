package dev.qsim.internal;

import java.lang.management.GarbageCollectorMXBean;
import java.lang.management.ManagementFactory;
import java.util.Locale;

/**
 * What an array really occupies on this JVM's heap: its payload plus a 16-byte header, rounded
 * to 8 bytes, and under the G1 collector, for an array of at least half a heap region, whole
 * regions ("humongous" objects). The region size is the one given by
 * {@code -XX:G1HeapRegionSize}, else G1's own choice: the maximum heap over 2048, rounded down
 * to a power of two, between 1 MiB and 32 MiB (the JVM's own value is read when it tells it,
 * through the HotSpot diagnostic bean). Sources: Oracle, "Java Platform, Standard
 * Edition HotSpot Virtual Machine Garbage Collection Tuning Guide", release 17, chapter 9
 * (Garbage-First Garbage Collector), sections on region size and humongous objects; the
 * 16-byte array header of the 64-bit JVM with compressed class pointers is common practice.
 * Internal.
 */
public final class HeapLayout {
    private static final long MIB = 1L << 20;
    private static final long REGION = regionBytes();

    private HeapLayout() {
    }

    /**
     * Returns the bytes an array of {@code payload} bytes takes on the heap.
     *
     * @param payload the elements' bytes, at least 0
     * @return the bytes taken, region-rounded under G1 for large arrays
     */
    public static long arrayBytes(long payload) {
        long plain = (payload + 16 + 7) & ~7L;
        if (REGION > 0 && plain >= REGION / 2) {
            return (plain + REGION - 1) / REGION * REGION;
        }
        return plain;
    }

    /**
     * Returns the bytes a state vector's storage takes: its chunks of at most 2^24 amplitudes
     * (re/im interleaved, 16 bytes an amplitude in double precision, 8 in single) and the table
     * of chunks.
     *
     * @param n qubits
     * @param single whether single precision
     * @return the bytes taken
     */
    public static long stateBytes(int n, boolean single) {
        int chunkLog = Math.min(n, dev.qsim.kernel.Amplitudes.CHUNK_LOG);
        long count = 1L << (n - chunkLog);
        long payload = (single ? 8L : 16L) << chunkLog;
        return count * arrayBytes(payload) + arrayBytes(8 * count);
    }

    /**
     * Returns the G1 region size in bytes, or 0 when another collector runs.
     *
     * @return the region size
     */
    public static long region() {
        return REGION;
    }

    private static long regionBytes() {
        boolean g1 = false;
        for (GarbageCollectorMXBean gc : ManagementFactory.getGarbageCollectorMXBeans()) {
            g1 |= gc.getName().startsWith("G1");
        }
        if (!g1) {
            return 0;
        }
        try {
            // The JVM's own value, through the HotSpot diagnostic bean (plain JMX, so that only
            // java.management is needed).
            Object data = ManagementFactory.getPlatformMBeanServer().invoke(
                    new javax.management.ObjectName("com.sun.management:type=HotSpotDiagnostic"),
                    "getVMOption", new Object[] {"G1HeapRegionSize"},
                    new String[] {String.class.getName()});
            Object value = ((javax.management.openmbean.CompositeData) data).get("value");
            long v = size(String.valueOf(value));
            if (v > 0) {
                return v;
            }
        } catch (javax.management.JMException | RuntimeException e) {
            // not a HotSpot JVM: the options and G1's rule below
        }
        for (String arg : ManagementFactory.getRuntimeMXBean().getInputArguments()) {
            if (arg.startsWith("-XX:G1HeapRegionSize=")) {
                long v = size(arg.substring("-XX:G1HeapRegionSize=".length()));
                if (v > 0) {
                    return v;
                }
            }
        }
        long target = Runtime.getRuntime().maxMemory() / 2048;
        long r = Long.highestOneBit(Math.max(1, target));
        return Math.max(MIB, Math.min(32 * MIB, r));
    }

    /** A JVM size such as {@code 4m} or {@code 1048576}; -1 if unreadable. */
    private static long size(String s) {
        String t = s.trim().toLowerCase(Locale.ROOT);
        long unit = 1;
        if (t.endsWith("k")) {
            unit = 1L << 10;
        } else if (t.endsWith("m")) {
            unit = MIB;
        } else if (t.endsWith("g")) {
            unit = 1L << 30;
        }
        if (unit > 1) {
            t = t.substring(0, t.length() - 1);
        }
        try {
            return Long.parseLong(t) * unit;
        } catch (NumberFormatException e) {
            return -1;
        }
    }
}
