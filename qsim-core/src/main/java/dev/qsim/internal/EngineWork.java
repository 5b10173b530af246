package dev.qsim.internal;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;

import dev.qsim.kernel.Workload;

/**
 * The counted work of one run on one engine, before it is priced: passes over memory in
 * {@link Workload}s (each repeated some number of times, on some threads, by some number of
 * independent workers), the bytes held at the peak, the shots drawn and tallied, and the
 * stabilizer tableau's words. Each engine fills one in its own counter; the run facade prices
 * it. Mutable while filled. Internal.
 */
public final class EngineWork {
    /** An empty count, for a counter to fill. */
    public EngineWork() {
    }

    /**
     * Counted passes done {@code times} times, each on {@code threads} kernel threads, spread
     * over {@code workers} independent workers that share the machine.
     *
     * @param what what the part is, for reports
     * @param work the passes
     * @param times how many times they happen
     * @param threads kernel threads per pass
     * @param workers independent workers running parts at once
     */
    public record Part(String what, Workload work, double times, int threads, int workers) {
        /**
         * Checks the fields.
         *
         * @param what the description
         * @param work the passes
         * @param times the repetitions
         * @param threads the threads
         * @param workers the workers
         */
        public Part {
            Objects.requireNonNull(what, "what");
            Objects.requireNonNull(work, "work");
        }
    }

    private final List<Part> parts = new ArrayList<>();
    private final List<String> held = new ArrayList<>();
    private long bytes;
    private double shots;
    private double shotBits;
    private double[] tableau = new double[0];
    private double mpsUnits;
    private long mpsUpdates;
    private double mpsLargestBond;

    /**
     * Adds counted passes.
     *
     * @param part the part
     * @return this
     */
    public EngineWork add(Part part) {
        parts.add(Objects.requireNonNull(part, "part"));
        return this;
    }

    /**
     * Adds bytes held at the peak of the run.
     *
     * @param b the bytes
     * @param what what holds them, for reports
     * @return this
     */
    public EngineWork hold(long b, String what) {
        bytes += b;
        held.add(what);
        return this;
    }

    /**
     * Adds shots drawn from a final distribution and tallied.
     *
     * @param s the shots
     * @param width the classical bits of each
     * @return this
     */
    public EngineWork draw(double s, int width) {
        shots += s;
        shotBits += s * width;
        return this;
    }

    /**
     * Adds stabilizer tableau work: counts of the terms its cost model prices (runs, table
     * words, gates, gate words, measurements, their columns and words, replayed steps and
     * rows), added term by term.
     *
     * @param terms the counts
     * @return this
     */
    public EngineWork tableau(double[] terms) {
        if (tableau.length < terms.length) {
            tableau = java.util.Arrays.copyOf(tableau, terms.length);
        }
        for (int i = 0; i < terms.length; i++) {
            tableau[i] += terms[i];
        }
        return this;
    }

    /**
     * Adds matrix-product-state work: decomposition units ({@code m n min(m, n)} for each
     * {@code m x n} block split), the block updates and the largest bond dimension reached.
     *
     * @param units the units
     * @param updates the block updates
     * @param largestBond the largest bond dimension
     * @return this
     */
    public EngineWork mps(double units, long updates, double largestBond) {
        mpsUnits += units;
        mpsUpdates += updates;
        mpsLargestBond = Math.max(mpsLargestBond, largestBond);
        return this;
    }

    /**
     * Returns the matrix-product-state units counted.
     *
     * @return the units
     */
    public double mpsUnits() {
        return mpsUnits;
    }

    /**
     * Returns the matrix-product-state block updates counted.
     *
     * @return the updates
     */
    public long mpsUpdates() {
        return mpsUpdates;
    }

    /**
     * Returns the largest bond dimension of the matrix product state.
     *
     * @return the bond dimension
     */
    public double mpsLargestBond() {
        return mpsLargestBond;
    }

    /**
     * Returns the parts, in order.
     *
     * @return the parts, in order
     */
    public List<Part> parts() {
        return List.copyOf(parts);
    }

    /**
     * Returns the bytes held at the peak.
     *
     * @return the bytes held at the peak
     */
    public long bytes() {
        return bytes;
    }

    /**
     * Returns what holds the bytes, in words.
     *
     * @return what holds the bytes, in words
     */
    public List<String> held() {
        return List.copyOf(held);
    }

    /**
     * Returns the shots drawn and tallied.
     *
     * @return the shots drawn and tallied
     */
    public double shots() {
        return shots;
    }

    /**
     * Returns the classical bits of all shots tallied.
     *
     * @return the classical bits of all shots tallied
     */
    public double shotBits() {
        return shotBits;
    }

    /**
     * Returns the stabilizer tableau's counted terms (empty if none).
     *
     * @return a copy of the counts
     */
    public double[] tableauTerms() {
        return tableau.clone();
    }
}
