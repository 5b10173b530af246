package dev.qsim;

import java.util.ArrayList;
import java.util.List;

import org.apache.commons.rng.UniformRandomProvider;

import dev.qsim.internal.ClassicalState;
import dev.qsim.internal.ShotRunner;
import dev.qsim.kernel.Amplitudes;
import dev.qsim.kernel.Frame;
import dev.qsim.kernel.GateOp;
import dev.qsim.kernel.Measurement;

/**
 * The state-vector engine behind {@link Simulator}: runs instructions on amplitudes through the
 * kernels, measures, resets, tests conditions, and tallies shots.
 *
 * <p>Shots: a circuit whose measurements come last ({@link Circuit#measuresAtEnd()}) is
 * simulated once and its shots drawn from the final state in one pass; any other circuit shot
 * by shot, after the gates before its first measurement, reset or condition have been
 * simulated once and copied for each shot.
 */
final class AmplitudeEngine {
    private AmplitudeEngine() {
    }

    /** Applies gates {@code [from, to)} of a list, in order, through the lazy frame. */
    static void gates(Amplitudes a, List<Instruction> list, int from, int to, int threads) {
        List<GateOp> ops = new ArrayList<>(to - from);
        for (int i = from; i < to; i++) {
            ops.add(list.get(i).plan());
        }
        Frame.apply(a, ops, threads);
    }

    /**
     * Returns the list with each run of consecutive gates fused (see {@link Fusion});
     * measurements, resets and conditioned blocks stay where they are.
     */
    static List<Instruction> fuse(List<Instruction> list) {
        List<Instruction> out = new ArrayList<>();
        int i = 0;
        while (i < list.size()) {
            if (list.get(i).isClassical()) {
                out.add(list.get(i++));
                continue;
            }
            int j = i;
            while (j < list.size() && !list.get(j).isClassical()) {
                j++;
            }
            out.addAll(Fusion.fuse(list.subList(i, j)));
            i = j;
        }
        return out;
    }

    /** The state-vector side of the shot interpreter: one state, one generator. */
    static final class Backend implements ShotRunner.Backend {
        private final Amplitudes a;
        private final UniformRandomProvider rng;
        private final int threads;

        Backend(Amplitudes a, UniformRandomProvider rng, int threads) {
            this.a = a;
            this.rng = rng;
            this.threads = threads;
        }

        @Override
        public void gates(List<Instruction> list, int from, int to) {
            AmplitudeEngine.gates(a, list, from, to, threads);
        }

        @Override
        public void gate(Instruction gate, double[] angles) {
            Frame.apply(a, List.of(GateOp.of(gate.gate().operator(angles).raw(),
                    gate.targets(), gate.controls())), threads);
        }

        @Override
        public boolean measure(Instruction measure) {
            return Measurement.measure(a, measure.targetsRaw()[0], rng.nextDouble(), threads)
                    == 1;
        }

        @Override
        public void reset(Instruction reset) {
            Measurement.reset(a, reset.targetsRaw()[0], rng.nextDouble(), threads);
        }
    }

    /** Runs instructions from index {@code from} on, for one shot. */
    static void run(Amplitudes a, Circuit circuit, List<Instruction> list, int from,
            ClassicalState state, UniformRandomProvider rng, int threads) {
        ShotRunner.run(list, from, state, circuit.variables(), new Backend(a, rng, threads));
    }

    /**
     * Runs a circuit for a number of shots on a fresh state and tallies its classical bits.
     *
     * @param circuit the circuit
     * @param shots at least 1
     * @param state a zero state of the circuit's size. Modified.
     * @param rng the generator
     * @param fuse whether to fuse gates
     * @param threads threads
     * @return the tally
     */
    static Tally run(Circuit circuit, int shots, StateVector state, UniformRandomProvider rng,
            boolean fuse, int threads) {
        List<Instruction> original = circuit.instructions();
        if (circuit.measuresAtEnd()) {
            return sampleAtEnd(circuit, state, shots, rng, fuse, threads);
        }
        List<Instruction> list = fuse ? fuse(original) : original;
        int first = 0;
        while (first < list.size() && !list.get(first).isClassical()) {
            first++;
        }
        gates(state.store(), list, 0, first, threads);
        Amplitudes prefix = state.store();
        Amplitudes work = state.copy().store();
        int width = circuit.clbits();
        boolean[] reg = new boolean[width];
        ClassicalState classical = new ClassicalState(width, circuit.variables().size());
        Backend backend = new Backend(work, rng, threads);
        Tally.Recorder outcomes = Tally.recorder(width);
        for (int s = 0; s < shots; s++) {
            work.copyFrom(prefix);
            classical.clear();
            ShotRunner.run(list, first, classical, circuit.variables(), backend);
            classical.copyBits(reg);
            outcomes.add(reg, 1);
        }
        return outcomes.build();
    }

    private static Tally sampleAtEnd(Circuit circuit, StateVector state, int shots,
            UniformRandomProvider rng, boolean fuse, int threads) {
        List<Instruction> gates = circuit.withoutMeasurements().instructions();
        // Measured qubits are not touched afterwards, so all gates may run first.
        List<Instruction> program = fuse ? Fusion.fuse(gates) : gates;
        gates(state.store(), program, 0, program.size(), threads);
        int width = circuit.clbits();
        int[] source = circuit.clbitSources();
        boolean measured = false;
        for (int q : source) {
            measured |= q >= 0;
        }
        Tally.Recorder outcomes = Tally.recorder(width);
        if (!measured) {
            return outcomes.add(new boolean[width], shots).build();
        }
        long[] idx = state.sampleIndices(shots, rng);
        boolean[] reg = new boolean[width];
        for (int s = 0; s < shots; s++) {
            for (int c = 0; c < width; c++) {
                reg[c] = source[c] >= 0 && ((idx[s] >>> source[c]) & 1L) == 1;
            }
            outcomes.add(reg, 1);
        }
        return outcomes.build();
    }
}
