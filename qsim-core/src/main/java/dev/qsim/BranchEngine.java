package dev.qsim;

import java.util.ArrayList;
import java.util.List;

import dev.qsim.internal.ClassicalState;
import dev.qsim.internal.Heap;
import dev.qsim.internal.ShotRunner;
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

    /** One branch: a normalised state, its weight and its classical bits and variables. */
    private static final class Branch {
        final Amplitudes state;
        final double weight;
        final ClassicalState classical;

        Branch(Amplitudes state, double weight, ClassicalState classical) {
            this.state = state;
            this.weight = weight;
            this.classical = classical;
        }
    }

    private final int threads;
    private final int maxBranches;
    private final List<Circuit.Variable> variables;

    private BranchEngine(int qubits, int threads, long budgetBytes,
            List<Circuit.Variable> variables) {
        this.threads = threads;
        this.variables = variables;
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
        BranchEngine engine = new BranchEngine(circuit.qubits(), threads, budgetBytes,
                circuit.variables());
        int n = circuit.qubits();
        Amplitudes zero = Heap.allocate(Amplitudes.bytes(n), "a " + n + "-qubit branch state",
                () -> Amplitudes.allocate(n));
        zero.set(0, 1, 0);
        zero.setThreads(threads);
        List<Branch> branches = new ArrayList<>();
        branches.add(new Branch(zero, 1, new ClassicalState(circuit.clbits(),
                circuit.variables().size())));
        branches = engine.run(circuit.instructions(), branches);
        double[] out = new double[1 << circuit.clbits()];
        for (Branch b : branches) {
            out[(int) b.classical.register()] += b.weight;
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
                    if (in.isDynamic()) {
                        for (Branch b : current) {
                            new AmplitudeEngine.Backend(b.state, null, threads).gate(in,
                                    ShotRunner.angles(in, b.classical));
                        }
                        break;
                    }
                    int j = i + 1;
                    while (j < list.size() && list.get(j).kind() == Instruction.Kind.GATE
                            && !list.get(j).isDynamic()) {
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
                case DELAY:
                    break;
                case ASSIGN:
                    for (Branch b : current) {
                        ShotRunner.assign(in, b.classical, variables);
                    }
                    break;
                case WHILE: {
                    List<Branch> done = new ArrayList<>();
                    List<Branch> active = current;
                    for (int k = 0; k < in.maxIterations() && !active.isEmpty(); k++) {
                        List<Branch> looping = new ArrayList<>();
                        for (Branch b : active) {
                            (in.condition().test(b.classical) ? looping : done).add(b);
                        }
                        active = looping.isEmpty() ? looping : run(in.body(), looping);
                    }
                    done.addAll(active);
                    current = done;
                    break;
                }
                default: {
                    List<Branch> taken = new ArrayList<>();
                    List<Branch> kept = new ArrayList<>();
                    for (Branch b : current) {
                        boolean holds = in.kind() == Instruction.Kind.IF_BIT
                                ? b.classical.bit(in.clbit()) == (in.value() == 1)
                                : in.condition().test(b.classical);
                        (holds ? taken : kept).add(b);
                    }
                    List<Branch> out = new ArrayList<>(taken.isEmpty() ? taken
                            : run(in.body(), taken));
                    out.addAll(kept.isEmpty() || in.otherwise().isEmpty() ? kept
                            : run(in.otherwise(), kept));
                    current = out;
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
                // Each branch owns its classical state: assignments change it in place.
                ClassicalState classical = b.classical.copy();
                if (reset) {
                    if (outcome == 1) {
                        Measurement.flip(state, q, threads);
                    }
                } else {
                    classical.setBit(in.clbit(), outcome == 1);
                }
                out.add(new Branch(state, w, classical));
            }
        }
        return out;
    }
}
