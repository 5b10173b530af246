package dev.qsim.kernel;

/**
 * The amplitudes of an n-qubit state in primitive arrays: chunks of {@code 2^chunkLog}
 * amplitudes, real and imaginary parts interleaved, so a state may exceed Java's largest array.
 * Amplitude {@code i} lives in chunk {@code i >>> chunkLog} at offset {@code 2 * (i & chunkMask)}.
 * Double precision ({@link #chunks()}) or single precision ({@link #singles()}, {@code float},
 * half the memory); exactly one of the two is present. The gate kernels (the {@link Plan}s of
 * {@link DenseKernels}, {@link DiagonalKernels} and {@link PermutationKernels}) work on double
 * storage only; single storage is worked on through {@link Windows}, which widens a window to
 * double, applies the kernels there and rounds back. Mutable; not thread-safe.
 *
 * <p>One way in: the storage may carry a lazy frame (see {@link Frame}) that only the gate path
 * of this package may leave pending. Every public accessor ({@link #chunks()},
 * {@link #singles()}, {@link #re}, {@link #im}, {@link #set}, {@link #read}, {@link #write})
 * settles it first, so code outside this package cannot read or write amplitudes with a frame
 * pending; kernel code uses the fields directly. Internal.
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
    final float[][] singles;

    /*
     * The lazy frame (see Frame): the state this storage stands for is X^flips D times the
     * stored amplitudes, where D is the product over qubits q of diag(phases[4q] + i
     * phases[4q+1], phases[4q+2] + i phases[4q+3]) (null: every factor is 1). Identity unless
     * Frame put something there; `framed` says whether either part is present.
     */
    long flips;
    double[] phases;
    volatile boolean framed;

    /** Threads for passes this storage starts itself (settling the frame). */
    private volatile int threads = 1;

    /**
     * The vector loops the kernels use on this storage, or null for the scalar loops: the JVM's
     * choice ({@link Lanes}) unless a test asked for the scalar loops ({@link #useLanes}).
     */
    LaneKernels lanes;

    private Amplitudes(int n, int chunkLog, double[][] chunks, float[][] singles) {
        this.n = n;
        this.chunkLog = chunkLog;
        this.chunkMask = (1L << chunkLog) - 1;
        this.chunks = chunks;
        this.singles = singles;
        this.lanes = Lanes.kernels();
    }

    /**
     * Sets the loops the kernels use on this storage: tests run the scalar and the vector loops
     * side by side; the scratch windows of {@link Windows} take their source's.
     *
     * @param kernels the vector loops, or null for the scalar ones
     * @return this storage
     */
    Amplitudes useLanes(LaneKernels kernels) {
        this.lanes = kernels;
        return this;
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
        return new Amplitudes(n, chunkLog, chunks, null);
    }

    /**
     * Makes a storage with a size and no amplitudes, for planning passes without running them
     * ({@link Workload}): its chunk table is empty, so no kernel may run on it.
     *
     * @param n qubits, {@code 1 <= n <= 40}
     * @param single whether it stands for single precision
     * @return the storage
     */
    static Amplitudes phantom(int n, boolean single) {
        int chunkLog = Math.min(n, CHUNK_LOG);
        return single ? new Amplitudes(n, chunkLog, null, new float[0][])
                : new Amplitudes(n, chunkLog, new double[0][], null);
    }

    /**
     * Allocates a zero vector in single precision on n qubits.
     *
     * @param n qubits, {@code 1 <= n <= 40}
     * @return the storage
     */
    public static Amplitudes allocateSingle(int n) {
        return allocateSingle(n, Math.min(n, CHUNK_LOG));
    }

    /**
     * Allocates in single precision with a given chunk size; tests use small chunks.
     *
     * @param n qubits
     * @param chunkLog log2 of the amplitudes per chunk, at most n
     * @return the storage, all zero
     */
    public static Amplitudes allocateSingle(int n, int chunkLog) {
        int count = 1 << (n - chunkLog);
        float[][] chunks = new float[count][];
        for (int c = 0; c < count; c++) {
            chunks[c] = new float[2 << chunkLog];
        }
        return new Amplitudes(n, chunkLog, null, chunks);
    }

    /**
     * Returns the bytes an n-qubit state occupies in double precision.
     *
     * @param n qubits
     * @return 16 * 2^n
     */
    public static long bytes(int n) {
        return 16L << n;
    }

    /**
     * Returns the bytes an n-qubit state occupies.
     *
     * @param n qubits
     * @param single whether in single precision
     * @return 8 * 2^n for single, 16 * 2^n for double precision
     */
    public static long bytes(int n, boolean single) {
        return single ? 8L << n : 16L << n;
    }

    /**
     * Tells whether the amplitudes are stored as {@code float}.
     *
     * @return whether the storage is single precision
     */
    public boolean isSingle() {
        return singles != null;
    }

    /**
     * Returns the single-precision chunk arrays themselves (live), laid out as
     * {@link #chunks()}; null for double storage.
     *
     * @return the chunks, or null
     */
    public float[][] singles() {
        settle();
        return singles;
    }

    /**
     * Returns the number of qubits.
     *
     * @return the qubit count
     */
    public int qubits() {
        return n;
    }

    /**
     * Returns the double-precision chunk arrays themselves (live); null for single storage.
     * Amplitude {@code i} is in chunk
     * {@code i >>> chunkLog()} at double offset {@code 2 * (i & ((1 << chunkLog()) - 1))}.
     *
     * @return the chunks
     */
    public double[][] chunks() {
        settle();
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

    /**
     * Returns a deep copy, in the same precision, with the same lazy frame.
     *
     * @return the copy
     */
    public Amplitudes copy() {
        if (singles != null) {
            float[][] c = new float[singles.length][];
            for (int i = 0; i < c.length; i++) {
                c[i] = singles[i].clone();
            }
            return new Amplitudes(n, chunkLog, null, c).frameFrom(this).useLanes(lanes);
        }
        double[][] c = new double[chunks.length][];
        for (int i = 0; i < c.length; i++) {
            c[i] = chunks[i].clone();
        }
        return new Amplitudes(n, chunkLog, c, null).frameFrom(this).useLanes(lanes);
    }

    /** Takes a copy of another storage's lazy frame; returns this. */
    private Amplitudes frameFrom(Amplitudes other) {
        flips = other.flips;
        phases = other.phases == null ? null : other.phases.clone();
        framed = other.framed;
        return this;
    }

    /**
     * Tells whether a lazy frame is pending (see {@link Frame}).
     *
     * @return whether a frame is pending
     */
    public boolean framed() {
        return framed;
    }

    /**
     * Returns a copy in the other or the same precision: widening is exact, narrowing rounds
     * each part to the nearest {@code float}.
     *
     * @param single whether the copy is in single precision
     * @return the copy, with the default chunk size
     */
    public Amplitudes convert(boolean single) {
        if (single == isSingle() && chunkLog == Math.min(n, CHUNK_LOG)) {
            return copy();
        }
        Amplitudes out = (single ? allocateSingle(n) : allocate(n)).useLanes(lanes);
        int bl = Math.min(chunkLog, out.chunkLog);
        double[] buf = new double[2 << bl];
        for (long first = 0; first < (1L << n); first += 1L << bl) {
            read(first, bl, buf, 0);
            out.write(first, bl, buf, 0);
        }
        return out.frameFrom(this);
    }

    /**
     * Copies the amplitudes (and the lazy frame) of another state of the same size, precision
     * and chunk size into this one.
     *
     * @param other the source
     */
    public void copyFrom(Amplitudes other) {
        frameFrom(other);
        if (singles != null) {
            for (int i = 0; i < singles.length; i++) {
                System.arraycopy(other.singles[i], 0, singles[i], 0, singles[i].length);
            }
            return;
        }
        for (int i = 0; i < chunks.length; i++) {
            System.arraycopy(other.chunks[i], 0, chunks[i], 0, chunks[i].length);
        }
    }

    /**
     * Reads the {@code 2^log} amplitudes from index {@code first} (a multiple of
     * {@code 2^log}, {@code log <= chunkLog}) into {@code out} as doubles, interleaved.
     *
     * @param first first index
     * @param log log2 of the count
     * @param out the destination. Modified.
     * @param at the first double of {@code out} to write; {@code 2^(log+1)} are written
     */
    public void read(long first, int log, double[] out, int at) {
        settle();
        readRaw(first, log, out, at);
    }

    /** {@link #read} with the frame left as it is: for kernel code that knows the frame. */
    void readRaw(long first, int log, double[] out, int at) {
        int c = (int) (first >>> chunkLog);
        int o = (int) (first & chunkMask) << 1;
        int len = 2 << log;
        if (singles == null) {
            System.arraycopy(chunks[c], o, out, at, len);
            return;
        }
        float[] f = singles[c];
        if (lanes != null) {
            lanes.widen(f, o, out, at, 1 << log);
            return;
        }
        for (int x = 0; x < len; x++) {
            out[at + x] = f[o + x];
        }
    }

    /**
     * Writes {@code 2^log} amplitudes from {@code in} at index {@code first} (a multiple of
     * {@code 2^log}, {@code log <= chunkLog}), rounding to {@code float} in single precision.
     *
     * @param first first index
     * @param log log2 of the count
     * @param in the source. Not modified.
     * @param at the first double of {@code in} to read; {@code 2^(log+1)} are read
     */
    public void write(long first, int log, double[] in, int at) {
        settle();
        writeRaw(first, log, in, at);
    }

    /** {@link #write} with the frame left as it is: for kernel code that knows the frame. */
    void writeRaw(long first, int log, double[] in, int at) {
        int c = (int) (first >>> chunkLog);
        int o = (int) (first & chunkMask) << 1;
        int len = 2 << log;
        if (singles == null) {
            System.arraycopy(in, at, chunks[c], o, len);
            return;
        }
        float[] f = singles[c];
        if (lanes != null) {
            lanes.narrow(in, at, f, o, 1 << log);
            return;
        }
        for (int x = 0; x < len; x++) {
            f[o + x] = (float) in[at + x];
        }
    }

    /**
     * Returns the real part of one amplitude.
     *
     * @param index basis index
     * @return the real part of amplitude {@code index}
     */
    public double re(long index) {
        settle();
        int o = (int) (index & chunkMask) << 1;
        if (singles != null) {
            return singles[(int) (index >>> chunkLog)][o];
        }
        return chunks[(int) (index >>> chunkLog)][o];
    }

    /**
     * Returns the imaginary part of one amplitude.
     *
     * @param index basis index
     * @return the imaginary part of amplitude {@code index}
     */
    public double im(long index) {
        settle();
        int o = ((int) (index & chunkMask) << 1) + 1;
        if (singles != null) {
            return singles[(int) (index >>> chunkLog)][o];
        }
        return chunks[(int) (index >>> chunkLog)][o];
    }

    /**
     * Sets one amplitude (rounded to {@code float} in single precision).
     *
     * @param index basis index
     * @param re real part
     * @param im imaginary part
     */
    public void set(long index, double re, double im) {
        settle();
        int o = (int) (index & chunkMask) << 1;
        if (singles != null) {
            float[] f = singles[(int) (index >>> chunkLog)];
            f[o] = (float) re;
            f[o + 1] = (float) im;
            return;
        }
        double[] a = chunks[(int) (index >>> chunkLog)];
        a[o] = re;
        a[o + 1] = im;
    }

    /**
     * Applies a pending lazy frame to the amplitudes (one pass) and clears it; nothing happens
     * without one. Safe to call from several threads at once.
     */
    public void settle() {
        if (framed) {
            Frame.settle(this, threads);
        }
    }

    /**
     * Sets the threads this storage uses for passes it starts itself (settling the frame).
     *
     * @param threads 1 to {@link Parallel#MAX_THREADS}; unchecked
     */
    public void setThreads(int threads) {
        this.threads = threads;
    }

    /** Sets every amplitude to zero (and drops the lazy frame). */
    public void clear() {
        flips = 0;
        phases = null;
        framed = false;
        if (singles != null) {
            for (float[] c : singles) {
                java.util.Arrays.fill(c, 0f);
            }
            return;
        }
        for (double[] c : chunks) {
            java.util.Arrays.fill(c, 0.0);
        }
    }
}
