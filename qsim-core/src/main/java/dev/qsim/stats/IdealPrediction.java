package dev.qsim.stats;

import dev.qsim.Circuit;
import dev.qsim.Instruction;
import dev.qsim.StateVector;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Objects;
import java.util.Set;

/**
 * The exact outcome distribution of a circuit on a noiseless machine, to compare a device's
 * tally with. Stateless and thread-safe.
 *
 * <p>It handles circuits whose measurements can all be moved to the end: no reset, no condition,
 * and no gate on a qubit after that qubit was measured (gates on other qubits commute with the
 * measurement; the principle of deferred measurement, Nielsen and Chuang 2010, §4.4). The
 * distribution over the classical bits then follows from the Born rule on the state the gates
 * make from |0...0&gt;: an outcome's probability is the sum of the probabilities of the basis
 * states whose measured bits spell it; bits never written read 0.
 *
 * @since 0.2
 */
public final class IdealPrediction {
    /** The most qubits (and classical bits) a prediction handles: {@value}. */
    public static final int MAX_QUBITS = 26;

    private IdealPrediction() {
    }

    /**
     * Returns the state the circuit's gates make from |0...0&gt;, leaving out its terminal
     * measurements.
     *
     * @param circuit a circuit of gates with terminal measurements only, at most
     *     {@value #MAX_QUBITS} qubits
     * @return a new state
     * @throws IllegalArgumentException if the circuit resets, has conditions, applies a gate to
     *     a qubit after measuring it, or is too large
     */
    public static StateVector state(Circuit circuit) {
        Objects.requireNonNull(circuit, "circuit");
        if (circuit.qubits() > MAX_QUBITS) {
            throw new IllegalArgumentException("a prediction handles at most " + MAX_QUBITS
                    + " qubits but the circuit has " + circuit.qubits());
        }
        Circuit.Builder gates = Circuit.builder(circuit.qubits(), 0);
        Set<Integer> measured = new HashSet<>();
        List<Instruction> list = circuit.instructions();
        for (int i = 0; i < list.size(); i++) {
            Instruction in = list.get(i);
            switch (in.kind()) {
                case MEASURE:
                    measured.add(in.targets()[0]);
                    break;
                case GATE:
                    for (int q : qubitsOf(in)) {
                        if (measured.contains(q)) {
                            throw new IllegalArgumentException("instruction " + i + " '" + in
                                    + "' acts on qubit " + q + " after it was measured; a"
                                    + " prediction needs measurements at the end only");
                        }
                    }
                    if (in.controls().length > 0) {
                        gates.controlled(in.operator(), in.controls(), in.targets());
                    } else {
                        gates.apply(in.operator(), in.targets());
                    }
                    break;
                default:
                    throw new IllegalArgumentException("instruction " + i + " '" + in + "' is "
                            + (in.kind() == Instruction.Kind.RESET ? "a reset"
                            : "a conditioned block") + "; a prediction handles gates and"
                            + " terminal measurements only");
            }
        }
        return StateVector.zero(circuit.qubits()).withThreads(1).apply(gates.build());
    }

    private static int[] qubitsOf(Instruction in) {
        int[] t = in.targets();
        int[] c = in.controls();
        int[] all = java.util.Arrays.copyOf(c, c.length + t.length);
        System.arraycopy(t, 0, all, c.length, t.length);
        return all;
    }

    /**
     * Returns the probability of each outcome the circuit can report. If the circuit measures,
     * outcomes are values of its classical bits ({@code 2^clbits} entries); if it measures
     * nothing, outcomes are the basis states of its qubits, as if every qubit {@code k} were
     * measured into bit {@code k}.
     *
     * @param circuit a circuit of gates with terminal measurements only
     * @return the probabilities, entry {@code i} for the outcome of binary value {@code i}
     * @throws IllegalArgumentException as {@link #state(Circuit)}, or if the circuit has more
     *     than {@value #MAX_QUBITS} classical bits
     */
    public static double[] outcomes(Circuit circuit) {
        StateVector state = state(circuit);
        double[] p = state.probabilities();
        List<int[]> pairs = new ArrayList<>();
        for (Instruction in : circuit.instructions()) {
            if (in.kind() == Instruction.Kind.MEASURE) {
                pairs.add(new int[] {in.targets()[0], in.clbit()});
            }
        }
        if (pairs.isEmpty()) {
            return p;
        }
        if (circuit.clbits() > MAX_QUBITS) {
            throw new IllegalArgumentException("a prediction handles at most " + MAX_QUBITS
                    + " classical bits but the circuit has " + circuit.clbits());
        }
        // The last measurement into a clbit decides it.
        int[] source = new int[circuit.clbits()];
        java.util.Arrays.fill(source, -1);
        for (int[] pq : pairs) {
            source[pq[1]] = pq[0];
        }
        double[] out = new double[1 << circuit.clbits()];
        for (int i = 0; i < p.length; i++) {
            if (p[i] == 0) {
                continue;
            }
            int v = 0;
            for (int c = 0; c < source.length; c++) {
                if (source[c] >= 0 && ((i >>> source[c]) & 1) == 1) {
                    v |= 1 << c;
                }
            }
            out[v] += p[i];
        }
        return out;
    }
}
