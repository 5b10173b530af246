package dev.qsim.kernel;

/**
 * The amplitudes of an n-qubit state in primitive arrays: chunks of {@code 2^chunkLog}
 * amplitudes, real and imaginary parts interleaved, so a state may exceed Java's largest array.
 * Amplitude {@code i} lives in chunk {@code i >>> chunkLog} at double offset
 * {@code 2 * (i & chunkMask)}. Mutable; not thread-safe. Internal.
 */
public final class Amplitudes {
    /**
     * Log2 of the amplitudes per chunk for large states: 256 MiB arrays. Not smaller, because
     * G1 rounds each huge array up to whole heap regions (16 MiB chunks wasted half the heap);
     * not larger, because partners more than 2^24 doubles apart inside one array ran seven
     * times slower on the machines we measured (a target qubit of 24 or more, paired within a
     * 512 MiB array), while the same pairs in two separate arrays ran at full speed.
     */
    public static final int CHUNK_LOG = 24;

    final int n;
    final int chunkLog;
    final long chunkMask;
    final double[][] chunks;

    private Amplitudes(int n, int chunkLog, double[][] chunks) {
        this.n = n;
        this.chunkLog = chunkLog;
        this.chunkMask = (1L << chunkLog) - 1;
        this.chunks = chunks;
    }

    /**
     * Allocates a zero vector (all amplitudes 0) on n qubits.
     *
     * @param n qubits, {@code 1 <= n <= 40}
     * @return the storage
     */
    public static Amplitudes allocate(int n) {
        return allocate(n, Math.min(n, CHUNK_LOG));
    }

    /**
     * Allocates with a given chunk size; tests use small chunks to reach every code path.
     *
     * @param n qubits
     * @param chunkLog log2 of the amplitudes per chunk, at most n
     * @return the storage, all zero
     */
    public static Amplitudes allocate(int n, int chunkLog) {
        int count = 1 << (n - chunkLog);
        double[][] chunks = new double[count][];
        for (int c = 0; c < count; c++) {
            chunks[c] = new double[2 << chunkLog];
        }
        return new Amplitudes(n, chunkLog, chunks);
    }

    /**
     * Returns the bytes an n-qubit state occupies.
     *
     * @param n qubits
     * @return 16 * 2^n
     */
    public static long bytes(int n) {
        return 16L << n;
    }

    /** @return the number of qubits */
    public int qubits() {
        return n;
    }

    /**
     * Returns the chunk arrays themselves (live). Amplitude {@code i} is in chunk
     * {@code i >>> chunkLog()} at double offset {@code 2 * (i & ((1 << chunkLog()) - 1))}.
     *
     * @return the chunks
     */
    public double[][] chunks() {
        return chunks;
    }

    /**
     * Returns log2 of the amplitudes per chunk.
     *
     * @return the chunk log
     */
    public int chunkLog() {
        return chunkLog;
    }

    /** @return a deep copy */
    public Amplitudes copy() {
        double[][] c = new double[chunks.length][];
        for (int i = 0; i < c.length; i++) {
            c[i] = chunks[i].clone();
        }
        return new Amplitudes(n, chunkLog, c);
    }

    /**
     * Copies the amplitudes of another state of the same size into this one.
     *
     * @param other the source, same qubit count
     */
    public void copyFrom(Amplitudes other) {
        for (int i = 0; i < chunks.length; i++) {
            System.arraycopy(other.chunks[i], 0, chunks[i], 0, chunks[i].length);
        }
    }

    /**
     * @param index basis index
     * @return the real part of amplitude {@code index}
     */
    public double re(long index) {
        return chunks[(int) (index >>> chunkLog)][(int) (index & chunkMask) << 1];
    }

    /**
     * @param index basis index
     * @return the imaginary part of amplitude {@code index}
     */
    public double im(long index) {
        return chunks[(int) (index >>> chunkLog)][((int) (index & chunkMask) << 1) + 1];
    }

    /**
     * Sets one amplitude.
     *
     * @param index basis index
     * @param re real part
     * @param im imaginary part
     */
    public void set(long index, double re, double im) {
        double[] a = chunks[(int) (index >>> chunkLog)];
        int o = (int) (index & chunkMask) << 1;
        a[o] = re;
        a[o + 1] = im;
    }

    /** Sets every amplitude to zero. */
    public void clear() {
        for (double[] c : chunks) {
            java.util.Arrays.fill(c, 0.0);
        }
    }
}
