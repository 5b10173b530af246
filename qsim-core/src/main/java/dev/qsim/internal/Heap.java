package dev.qsim.internal;

import java.util.Locale;
import java.util.function.Supplier;

/**
 * The one heap check of the module: before a large allocation, make sure the heap can hold it,
 * or fail at once with an {@link IllegalStateException} naming the bytes needed, the maximum
 * heap, what is free and the {@code -Xmx} that would do. Module-internal; not exported.
 */
public final class Heap {
    private static final long GIB = 1L << 30;

    private Heap() {
    }

    /**
     * Throws unless {@code bytes} more fit in the heap (after one garbage collection if needed).
     *
     * @param bytes the allocation
     * @param what what is being allocated, for the message
     * @throws IllegalStateException if the heap cannot hold it
     */
    public static void require(long bytes, String what) {
        Runtime rt = Runtime.getRuntime();
        long max = rt.maxMemory();
        if (bytes <= free(rt)) {
            return;
        }
        if (bytes < max) {
            System.gc();
            if (bytes <= free(rt)) {
                return;
            }
        }
        throw tooLarge(bytes, what);
    }

    /**
     * Checks the heap, then allocates; an {@link OutOfMemoryError} during the allocation (the
     * check raced with other allocations) becomes the same refusal.
     *
     * @param <T> what is made
     * @param bytes the bytes the allocation needs
     * @param what what is being allocated, for the message
     * @param make the allocation
     * @return what {@code make} returns
     * @throws IllegalStateException if the heap cannot hold it
     */
    public static <T> T allocate(long bytes, String what, Supplier<T> make) {
        require(bytes, what);
        try {
            return make.get();
        } catch (OutOfMemoryError e) {
            throw tooLarge(bytes, what);
        }
    }

    /**
     * Returns the refusal for an allocation the heap cannot hold.
     *
     * @param bytes the allocation
     * @param what what is being allocated
     * @return the exception, not thrown
     */
    public static IllegalStateException tooLarge(long bytes, String what) {
        Runtime rt = Runtime.getRuntime();
        return tooLarge(bytes, free(rt), rt.maxMemory(), what);
    }

    /**
     * Returns the exception for an allocation that does not fit in {@code free} bytes.
     *
     * @param bytes the allocation
     * @param free the free heap
     * @param max the maximum heap
     * @param what what is being allocated, for the message
     * @return the exception to throw
     */
    public static IllegalStateException tooLarge(long bytes, long free, long max, String what) {
        long used = max - free;
        // Head room of 1/8 plus 256 MiB for everything else the program holds.
        long want = used + bytes + bytes / 8 + (256L << 20);
        long xmxGib = (want + GIB - 1) / GIB;
        return new IllegalStateException(what + " needs " + size(bytes) + " (" + bytes
                + " bytes) but the maximum heap is " + size(max) + " with " + size(free)
                + " free; raise the heap, e.g. -Xmx" + xmxGib + "g");
    }

    private static long free(Runtime rt) {
        return rt.maxMemory() - (rt.totalMemory() - rt.freeMemory());
    }

    /**
     * Formats a byte count in MiB or GiB with one decimal.
     *
     * @param bytes the count
     * @return the text
     */
    public static String size(long bytes) {
        if (bytes >= GIB) {
            return String.format(Locale.ROOT, "%.1f GiB", bytes / (double) GIB);
        }
        return String.format(Locale.ROOT, "%.1f MiB", bytes / (double) (1L << 20));
    }
}
