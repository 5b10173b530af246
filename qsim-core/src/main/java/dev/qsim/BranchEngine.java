package dev.qsim;

import java.util.ArrayList;
import java.util.List;

import dev.qsim.internal.Heap;
import dev.qsim.kernel.Amplitudes;
import dev.qsim.kernel.Measurement;

/**
 * The exact outcome distribution of an ideal circuit that uses measured values during the shot
 * (mid-circuit measurement, reset, conditions): every measurement splits each branch into its
 * two outcomes, weighted by their Born probabilities (Nielsen and Chuang 2010, §2.2.3), and
 * conditions act on the branches whose register matches. The distribution of the classical
 * register is the sum of the branch weights by register value. Exact, at the cost of one state
 * vector per branch: refused (with {@link TooLarge}) past a branch budget, and the caller falls
 * back to sampling.
 */
final class BranchEngine {
    /** Branches whose weight is at most this are dropped (their outcomes cannot be seen). */
    static final double NEGLIGIBLE = 1e-16;

    /** Thrown when the branches would exceed the budget; the caller samples instead. */
    static final class TooLarge extends RuntimeException {
        private static final long serialVersionUID = 1L;

        TooLarge(String message) {
            super(message, null, false, false);
        }
    }

    /** One branch: a normalised state, its weight and its classical register. */
    private static final class Branch {
        final Amplitudes state;
        final double weight;
        final boolean[] register;

        Branch(Amplitudes state, double weight, boolean[] register) {
            this.state = state;
            this.weight = weight;
            this.register = register;
        }
    }

    private final int threads;
    private final int maxBranches;

    private BranchEngine(int qubits, int threads, long budgetBytes) {
        this.threads = threads;
        this.maxBranches = (int) Math.max(1, Math.min(1 << 16,
                budgetBytes / Amplitudes.bytes(qubits)));
    }

    /**
     * Returns the exact distribution of the classical register.
     *
     * @param circuit any circuit of at most 26 classical bits
     * @param threads kernel threads
     * @param budgetBytes the most bytes all branches may hold at once
     * @return {@code 2^clbits} probabilities
     * @throws TooLarge if the branches would exceed the budget
     */
    static double[] distribution(Circuit circuit, int threads, long budgetBytes) {
        BranchEngine engine = new BranchEngine(circuit.qubits(), threads, budgetBytes);
        int n = circuit.qubits();
        Amplitudes zero = Heap.allocate(Amplitudes.bytes(n), "a " + n + "-qubit branch state",
                () -> Amplitudes.allocate(n));
        zero.set(0, 1, 0);
        zero.setThreads(threads);
        List<Branch> branches = new ArrayList<>();
        branches.add(new Branch(zero, 1, new boolean[circuit.clbits()]));
        branches = engine.run(circuit.instructions(), branches);
        double[] out = new double[1 << circuit.clbits()];
        for (Branch b : branches) {
            int key = 0;
            for (int c = 0; c < b.register.length; c++) {
                if (b.register[c]) {
                    key |= 1 << c;
                }
            }
            out[key] += b.weight;
        }
        return out;
    }

    private List<Branch> run(List<Instruction> list, List<Branch> branches) {
        List<Branch> current = branches;
        int i = 0;
        while (i < list.size()) {
            Instruction in = list.get(i);
            switch (in.kind()) {
                case GATE: {
                    int j = i + 1;
                    while (j < list.size() && list.get(j).kind() == Instruction.Kind.GATE) {
                        j++;
                    }
                    for (Branch b : current) {
                        AmplitudeEngine.gates(b.state, list, i, j, threads);
                    }
                    i = j;
                    continue;
                }
                case MEASURE:
                case RESET:
                    current = split(current, in);
                    break;
                default: {
                    List<Branch> taken = new ArrayList<>();
                    List<Branch> kept = new ArrayList<>();
                    for (Branch b : current) {
                        (b.register[in.clbit()] == (in.value() == 1) ? taken : kept).add(b);
                    }
                    kept.addAll(taken.isEmpty() ? taken : run(in.body(), taken));
                    current = kept;
                    break;
                }
            }
            i++;
        }
        return current;
    }

    /** Splits every branch on a measurement or reset of one qubit. */
    private List<Branch> split(List<Branch> current, Instruction in) {
        int q = in.targets()[0];
        boolean reset = in.kind() == Instruction.Kind.RESET;
        List<Branch> out = new ArrayList<>(2 * current.size());
        for (Branch b : current) {
            double p1 = Measurement.probabilityOfOne(b.state, q, threads);
            double[] p = {1 - p1, p1};
            boolean reused = false;
            for (int outcome = 0; outcome <= 1; outcome++) {
                double w = b.weight * p[outcome];
                if (!(w > NEGLIGIBLE)) {
                    continue;
                }
                Amplitudes state;
                if (!reused && (outcome == 1 || !(b.weight * p[1] > NEGLIGIBLE))) {
                    state = b.state;
                    reused = true;
                } else {
                    if (out.size() + current.size() >= maxBranches) {
                        throw new TooLarge("more than " + maxBranches + " measurement branches");
                    }
                    state = Heap.allocate(Amplitudes.bytes(b.state.qubits()), "a branch state",
                            b.state::copy);
                    state.setThreads(threads);
                }
                Measurement.project(state, q, outcome, p[outcome], threads);
                boolean[] register = b.register;
                if (reset) {
                    if (outcome == 1) {
                        Measurement.flip(state, q, threads);
                    }
                } else {
                    register = register.clone();
                    register[in.clbit()] = outcome == 1;
                }
                out.add(new Branch(state, w, register));
            }
        }
        return out;
    }
}
