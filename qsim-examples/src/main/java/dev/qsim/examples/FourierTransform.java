package dev.qsim.examples;

import java.io.PrintStream;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;

import dev.qsim.Circuit;
import dev.qsim.StateVector;

/**
 * The quantum Fourier transform reveals the period of a register's pattern.
 *
 * <p><b>Scenario (invented).</b> The Tessel Point beacon flashes on every fourth tick of a
 * 32-tick frame, starting at tick 1. A five-qubit register holds all its flash ticks at once:
 * an equal superposition of ticks 1, 5, 9, ..., 29. Reading the register only gives one random
 * flash tick; reading it after a Fourier transform gives a multiple of 32/4 = 8, from which the
 * flash period follows.
 *
 * <p><b>Method.</b> The quantum Fourier transform maps |x&gt; to
 * {@code 1/sqrt(N) sum_y e^{2 pi i x y / N} |y>} (M. A. Nielsen and I. L. Chuang, <i>Quantum
 * Computation and Quantum Information</i>, Cambridge University Press, 2010, section 5.1,
 * equation 5.2). It is built from Hadamards, controlled phase rotations and a final reversal of
 * qubit order by swaps (D. Coppersmith, "An approximate Fourier transform useful in quantum
 * factoring", IBM Research Report RC 19642, 1994; Nielsen and Chuang figure 5.1). A state of
 * period r, with r a power of two dividing N, is turned into one whose only nonzero
 * probabilities, 1/r each, sit at the multiples of N/r (Nielsen and Chuang section 5.4.1).
 *
 * <p>Run with {@code java -jar qsim-examples.jar fourier}.
 */
public final class FourierTransform {

    /** Qubits of the invented beacon register. */
    public static final int DEFAULT_QUBITS = 5;

    /** Flash period of the invented beacon, in ticks. */
    public static final int DEFAULT_PERIOD = 4;

    /** First flash tick of the invented beacon. */
    public static final int DEFAULT_OFFSET = 1;

    /** Largest number of qubits accepted, so the example stays quick. */
    public static final int MAX_QUBITS = 12;

    /** Probabilities above this count as peaks. */
    static final double PEAK = 1e-9;

    private FourierTransform() {
    }

    /**
     * What the transform produced.
     *
     * @param qubits number of qubits n
     * @param period the period r of the input
     * @param offset the first nonzero basis state of the input
     * @param input the periodic input state; copied
     * @param output the state after the Fourier transform; copied
     * @param peaks the outcomes whose output probability exceeds 1e-9, ascending; copied
     */
    public record Result(int qubits, int period, int offset, StateVector input,
            StateVector output, List<Integer> peaks) {

        /**
         * Checks and copies the arguments.
         *
         * @param qubits number of qubits
         * @param period the period of the input
         * @param offset the first nonzero basis state of the input
         * @param input the periodic input state; copied
         * @param output the transformed state; copied
         * @param peaks the outcomes with nonzero probability; copied
         */
        public Result {
            input = Objects.requireNonNull(input, "input").copy();
            output = Objects.requireNonNull(output, "output").copy();
            peaks = List.copyOf(peaks);
        }

        /**
         * Returns a copy of the input state.
         *
         * @return the periodic input
         */
        @Override
        public StateVector input() {
            return input.copy();
        }

        /**
         * Returns a copy of the transformed state.
         *
         * @return the output
         */
        @Override
        public StateVector output() {
            return output.copy();
        }
    }

    /**
     * Builds the quantum Fourier transform on {@code qubits} qubits, with qubit n-1 as the most
     * significant bit of x and y: for each qubit j from n-1 down to 0, a Hadamard on j and then
     * {@code cphase(pi / 2^(j-m))} between m and j for each lower qubit m, and finally swaps that
     * reverse the qubit order.
     *
     * @param qubits number of qubits n, from 1 to {@value #MAX_QUBITS}
     * @return the transform as a circuit without measurement
     * @throws IllegalArgumentException if {@code qubits} is out of range
     */
    public static Circuit qft(int qubits) {
        if (qubits < 1 || qubits > MAX_QUBITS) {
            throw new IllegalArgumentException("qubits must be from 1 to " + MAX_QUBITS
                    + ", got " + qubits);
        }
        Circuit.Builder builder = Circuit.builder(qubits);
        for (int j = qubits - 1; j >= 0; j--) {
            builder.h(j);
            for (int m = j - 1; m >= 0; m--) {
                builder.cphase(m, j, Math.PI / (1 << (j - m)));
            }
        }
        for (int q = 0; q < qubits / 2; q++) {
            builder.swap(q, qubits - 1 - q);
        }
        return builder.build();
    }

    /**
     * Builds a circuit that prepares the equal superposition of {@code offset},
     * {@code offset + period}, {@code offset + 2 period}, ... below 2^n: X on the set bits of
     * {@code offset} among the low qubits, and a Hadamard on each qubit from log2(period) up.
     *
     * @param qubits number of qubits n, from 1 to {@value #MAX_QUBITS}
     * @param period a power of two from 1 to 2^n
     * @param offset from 0 to {@code period - 1}
     * @return the preparation circuit
     * @throws IllegalArgumentException if an argument is out of range
     */
    public static Circuit periodicInput(int qubits, int period, int offset) {
        if (qubits < 1 || qubits > MAX_QUBITS) {
            throw new IllegalArgumentException("qubits must be from 1 to " + MAX_QUBITS
                    + ", got " + qubits);
        }
        if (period < 1 || period > 1 << qubits || Integer.bitCount(period) != 1) {
            throw new IllegalArgumentException("period must be a power of two from 1 to "
                    + (1 << qubits) + " for " + qubits + " qubits, got " + period);
        }
        if (offset < 0 || offset >= period) {
            throw new IllegalArgumentException("offset must be from 0 to " + (period - 1)
                    + " for period " + period + ", got " + offset);
        }
        int low = Integer.numberOfTrailingZeros(period);
        Circuit.Builder builder = Circuit.builder(qubits);
        for (int q = 0; q < low; q++) {
            if ((offset >>> q & 1) == 1) {
                builder.x(q);
            }
        }
        for (int q = low; q < qubits; q++) {
            builder.h(q);
        }
        return builder.build();
    }

    /**
     * Prepares the periodic input, applies the transform, prints the circuit and the output
     * probabilities, and returns the states and the peaks.
     *
     * @param out where the report goes
     * @param qubits number of qubits n, from 1 to {@value #MAX_QUBITS}
     * @param period a power of two from 1 to 2^n
     * @param offset from 0 to {@code period - 1}
     * @return the states and the peaks
     * @throws IllegalArgumentException if an argument is out of range
     */
    public static Result run(PrintStream out, int qubits, int period, int offset) {
        Objects.requireNonNull(out, "out");
        Circuit prepare = periodicInput(qubits, period, offset);
        Circuit transform = qft(qubits);
        StateVector input = StateVector.zero(qubits).apply(prepare);
        StateVector output = input.copy().apply(transform);
        int size = 1 << qubits;
        double[] probabilities = output.probabilities();
        List<Integer> peaks = new ArrayList<>();
        double max = 0;
        for (int y = 0; y < size; y++) {
            if (probabilities[y] > PEAK) {
                peaks.add(y);
            }
            max = Math.max(max, probabilities[y]);
        }
        Result result = new Result(qubits, period, offset, input, output, peaks);

        Text.title(out, "Tessel Point beacon: reading a flash period with a Fourier transform");
        StringBuilder ticks = new StringBuilder();
        for (int x = offset; x < size; x += period) {
            ticks.append(ticks.length() == 0 ? "" : ", ").append(x);
        }
        out.println(Text.f("Input: equal superposition of ticks %s (period %d of N = %d).",
                ticks, period, size));

        Text.heading(out, "Fourier transform circuit on " + qubits + " qubits");
        out.print(transform.diagram());
        if (!transform.diagram().endsWith("\n")) {
            out.println();
        }
        out.println(Text.f("%d instructions, depth %d.", transform.size(), transform.depth()));

        Text.heading(out, "Output probabilities");
        out.println(Text.f("%3s  %-" + Math.max(qubits, 4) + "s  %11s  %s", "y", "bits",
                "probability", "bar"));
        for (int y = 0; y < size; y++) {
            double p = Math.abs(probabilities[y]) < PEAK ? 0.0 : probabilities[y];
            out.println(Text.f("%3d  %-" + Math.max(qubits, 4) + "s  %11.6f  %s%s", y,
                    Text.bits(y, qubits), p, Text.bar(p, max),
                    y % (size / period) == 0 ? "  <- multiple of " + size / period : "")
                    .stripTrailing());
        }
        out.println();
        out.println(Text.f("Peaks at y = %s: the multiples of N/period = %d/%d = %d.",
                join(peaks), size, period, size / period));
        if (peaks.size() > 1) {
            int spacing = peaks.get(1) - peaks.get(0);
            out.println(Text.f("Peak spacing %d, so the flash period is N/spacing = %d/%d = %d.",
                    spacing, size, spacing, size / spacing));
        }
        return result;
    }

    private static String join(List<Integer> values) {
        StringBuilder text = new StringBuilder();
        for (int v : values) {
            text.append(text.length() == 0 ? "" : ", ").append(v);
        }
        return text.toString();
    }

    /**
     * Runs the example from the command line; it takes no arguments.
     *
     * @param args no arguments
     */
    public static void main(String[] args) {
        Main.launch("fourier", args);
    }

    /** Refuses any argument and runs; used by {@link Main}. */
    static void fromArgs(String[] args, PrintStream out) {
        Args.requireAtMost(args, 0, "fourier");
        run(out, DEFAULT_QUBITS, DEFAULT_PERIOD, DEFAULT_OFFSET);
    }
}
