package dev.qsim;

import java.util.Locale;

/** Checks that the heap can hold an allocation before it is made. */
final class Memory {
    private static final long GIB = 1L << 30;

    private Memory() {
    }

    /**
     * Throws IllegalStateException if {@code bytes} more cannot fit in the heap.
     *
     * @param bytes the allocation
     * @param what what is being allocated, for the message
     */
    static void require(long bytes, String what) {
        Runtime rt = Runtime.getRuntime();
        long max = rt.maxMemory();
        if (bytes <= available(rt)) {
            return;
        }
        if (bytes < max) {
            System.gc();
            if (bytes <= available(rt)) {
                return;
            }
        }
        throw tooLarge(bytes, what);
    }

    /**
     * Returns the exception for an allocation the heap cannot hold.
     *
     * @param bytes the allocation
     * @param what what is being allocated, for the message
     * @return the exception to throw
     */
    static IllegalStateException tooLarge(long bytes, String what) {
        Runtime rt = Runtime.getRuntime();
        long max = rt.maxMemory();
        long used = rt.totalMemory() - rt.freeMemory();
        // Head room of 1/8 plus 256 MiB for everything else the program holds.
        long want = used + bytes + bytes / 8 + (256L << 20);
        long xmxGib = (want + GIB - 1) / GIB;
        return new IllegalStateException(what + " needs " + size(bytes) + " (" + bytes
                + " bytes) but the maximum heap is " + size(max) + " with " + size(max - used)
                + " free; raise the heap, e.g. -Xmx" + xmxGib + "g");
    }

    private static long available(Runtime rt) {
        return rt.maxMemory() - (rt.totalMemory() - rt.freeMemory());
    }

    static String size(long bytes) {
        if (bytes >= GIB) {
            return String.format(Locale.ROOT, "%.1f GiB", bytes / (double) GIB);
        }
        return String.format(Locale.ROOT, "%.1f MiB", bytes / (double) (1L << 20));
    }
}
