package dev.qsim.bench;

import dev.qsim.Precision;

/**
 * One row of the scaling report: a kernel, a circuit run or a noise engine at one size and
 * target in one precision, with the probe's copy and triad bandwidths measured next to it.
 * {@link CsvOutput#line(ReportRow)} writes it; {@link ScalingPlot} draws a list of them.
 *
 * <p>The bandwidth ({@link #gbps()}) divides the bytes of the passes by {@code passNanos}: for
 * a gate applied in a pass of its own that is its time, {@code nanosPerGate}; for a gate the
 * core keeps in its lazy frame ({@link Workloads#keptInFrame(String)}) it is the time of the
 * gate followed by the read that settles the frame, the one pass such a gate costs, measured
 * separately ({@link #withPass(double)}). Dividing by the frame gate's own time, a fraction of
 * a nanosecond, gave rates such as 7,188,111 GB/s.
 *
 * @param n the qubit count
 * @param kernel the kernel kind, {@code circuit-fused}, {@code circuit-unfused},
 *     {@code density-matrix} or {@code trajectory}
 * @param target the target name ({@code all} for circuit rows, {@code ghz} for trajectories)
 * @param threads the thread count
 * @param nanosPerGate the wall time of one gate, in nanoseconds
 * @param copyGbps the probe's copy bandwidth at this size, GB/s
 * @param triadGbps the probe's triad bandwidth at this size, GB/s
 * @param vectorQubits the qubits of the vector streamed per pass ({@code 2n} for a density
 *     matrix)
 * @param passes the passes over that vector per measured unit
 * @param precision how the state stored its amplitudes
 * @param passNanos the time of the pass the bandwidth counts, in nanoseconds
 */
record ReportRow(int n, String kernel, String target, int threads, double nanosPerGate,
        double copyGbps, double triadGbps, int vectorQubits, int passes, Precision precision,
        double passNanos) {

    /** A row whose bandwidth is that of its own time ({@code passNanos = nanosPerGate}). */
    ReportRow(int n, String kernel, String target, int threads, double nanosPerGate,
            double copyGbps, double triadGbps, int vectorQubits, int passes,
            Precision precision) {
        this(n, kernel, target, threads, nanosPerGate, copyGbps, triadGbps, vectorQubits, passes,
                precision, nanosPerGate);
    }

    /** This row with the bandwidth of a pass timed separately (a frame gate and its read). */
    ReportRow withPass(double nanos) {
        return new ReportRow(n, kernel, target, threads, nanosPerGate, copyGbps, triadGbps,
                vectorQubits, passes, precision, nanos);
    }

    /** A row of a double-precision state-vector gate: one pass over 2^n amplitudes. */
    ReportRow(int n, String kernel, String target, int threads, double nanosPerGate,
            double copyGbps, double triadGbps) {
        this(n, kernel, target, threads, nanosPerGate, copyGbps, triadGbps, Precision.DOUBLE);
    }

    /** A row of a state-vector gate in the given precision: one pass over 2^n amplitudes. */
    ReportRow(int n, String kernel, String target, int threads, double nanosPerGate,
            double copyGbps, double triadGbps, Precision precision) {
        this(n, kernel, target, threads, nanosPerGate, copyGbps, triadGbps, n, 1, precision);
    }

    /** A double-precision row over a vector of {@code vectorQubits}, {@code passes} times. */
    ReportRow(int n, String kernel, String target, int threads, double nanosPerGate,
            double copyGbps, double triadGbps, int vectorQubits, int passes) {
        this(n, kernel, target, threads, nanosPerGate, copyGbps, triadGbps, vectorQubits,
                passes, Precision.DOUBLE);
    }

    /**
     * Bandwidth in GB/s: {@code passes * 2 * B * 2^vectorQubits} bytes per {@code passNanos},
     * {@code B} the bytes of one amplitude in this row's precision (a density matrix of n
     * qubits is streamed as a vector of 2n qubits).
     */
    double gbps() {
        return passes * gigabytesPerSecond(vectorQubits, precision, passNanos);
    }

    /** Nanoseconds per amplitude of the streamed vector: {@code nanosPerGate / 2^vectorQubits}. */
    double nanosPerAmplitude() {
        return nanosPerGate / (double) (1L << vectorQubits);
    }

    /** Bytes of a double-precision {@code n}-qubit state: {@code 16 * 2^n}. */
    static long stateBytes(int n) {
        return stateBytes(n, Precision.DOUBLE.bytesPerAmplitude());
    }

    /**
     * Bytes of an {@code n}-qubit state of {@code bytesPerAmplitude} bytes per amplitude (16 in
     * double precision, 8 in single): {@code bytesPerAmplitude * 2^n}.
     */
    static long stateBytes(int n, int bytesPerAmplitude) {
        return (long) bytesPerAmplitude << n;
    }

    /** Bytes one gate moves on a double-precision {@code n}-qubit state: {@code 2 * 16 * 2^n}. */
    static long bytesMoved(int n) {
        return bytesMoved(n, Precision.DOUBLE);
    }

    /**
     * Bytes one single-qubit gate moves on {@code n} qubits stored in the given precision: every
     * amplitude is read once and written once, {@code 2 * B * 2^n} with {@code B} =
     * {@link Precision#bytesPerAmplitude()} (16 in double precision, 8 in single), common
     * practice for the bandwidth of a streaming kernel: bytes read plus bytes written. The same
     * count is used for every kernel kind, so {@code gb_per_s} is an effective rate: a kernel
     * that touches less than the whole state (a controlled gate) can exceed the copy bandwidth.
     * The double-precision scratch window a single-precision gate is worked on in stays in the
     * cache and is not counted.
     */
    static long bytesMoved(int n, Precision precision) {
        return 2 * stateBytes(n, precision.bytesPerAmplitude());
    }

    /**
     * Returns the bandwidth in GB/s (10^9 bytes per second) of a gate on a double-precision
     * state of {@code n} qubits that took {@code nanosPerGate}.
     */
    static double gigabytesPerSecond(int n, double nanosPerGate) {
        return gigabytesPerSecond(n, Precision.DOUBLE, nanosPerGate);
    }

    /**
     * Returns the bandwidth in GB/s (10^9 bytes per second) of a gate on {@code n} qubits stored
     * in the given precision that took {@code nanosPerGate}: bytes moved per nanosecond, which is
     * the same number.
     */
    static double gigabytesPerSecond(int n, Precision precision, double nanosPerGate) {
        return bytesMoved(n, precision) / nanosPerGate;
    }
}
