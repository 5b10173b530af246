package dev.qsim.mps;

import java.util.IdentityHashMap;
import java.util.List;
import java.util.Map;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

import dev.qsim.Circuit;
import dev.qsim.Instruction;
import dev.qsim.Tally;
import dev.qsim.internal.Bridge;
import dev.qsim.internal.ClassicalState;
import dev.qsim.internal.ShotRunner;

/**
 * The matrix-product-state engine behind {@link dev.qsim.Simulator}: runs circuits on a
 * {@link Chain}. A circuit whose measurements come last ({@link Circuit#measuresAtEnd()}) is
 * simulated once and its shots drawn from the final state by sequential conditional sampling
 * (Ferris and Vidal 2012); any other circuit shot by shot through {@link ShotRunner}, the gates
 * before its first measurement, reset or condition simulated once and copied for each shot.
 * Randomness: the XoRoShiRo128++ generator of Commons RNG seeded with the run's seed, one
 * uniform per measured or sampled qubit.
 */
final class MatrixProductEngine implements Bridge.MatrixProducts {

    /** The quantum side of one shot: one chain, one generator, the gate matrices. */
    static final class Backend implements ShotRunner.Backend {
        private Chain chain;
        private final UniformRandomProvider rng;
        private final Map<Instruction, double[]> matrices = new IdentityHashMap<>();

        Backend(Chain chain, UniformRandomProvider rng) {
            this.chain = chain;
            this.rng = rng;
        }

        void use(Chain c) {
            this.chain = c;
        }

        Chain chain() {
            return chain;
        }

        @Override
        public void gates(List<Instruction> list, int from, int to) {
            for (int i = from; i < to; i++) {
                Instruction in = list.get(i);
                double[] m = matrices.computeIfAbsent(in, x -> GateMatrices.of(x, null));
                chain.applyGate(in.qubits(), m);
            }
        }

        @Override
        public void gate(Instruction gate, double[] angles) {
            chain.applyGate(gate.qubits(), GateMatrices.of(gate, angles));
        }

        @Override
        public boolean measure(Instruction measure) {
            return chain.measure(measure.targets()[0], rng.nextDouble()) == 1;
        }

        @Override
        public void reset(Instruction reset) {
            chain.reset(reset.targets()[0], rng.nextDouble());
        }
    }

    /** The first instruction that is not a gate with angles known before the shot, or size. */
    private static int firstClassical(List<Instruction> list) {
        int i = 0;
        while (i < list.size() && list.get(i).kind() == Instruction.Kind.GATE
                && !list.get(i).isDynamic()) {
            i++;
        }
        return i;
    }

    @Override
    public Tally run(Circuit circuit, int shots, long seed, int bondLimit, double truncation) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        Chain chain = Chain.zero(circuit.qubits(), bondLimit, truncation);
        Backend backend = new Backend(chain, rng);
        int width = circuit.clbits();
        Tally.Recorder outcomes = Tally.recorder(width);
        boolean[] reg = new boolean[width];
        if (circuit.measuresAtEnd()) {
            List<Instruction> gates = circuit.withoutMeasurements().instructions();
            backend.gates(gates, 0, gates.size());
            int[] source = circuit.clbitSources();
            int last = -1;
            for (int q : source) {
                last = Math.max(last, q);
            }
            if (last < 0) {
                return outcomes.add(reg, shots).build();
            }
            chain.moveCenter(0);
            Reads.Sampler sampler = new Reads.Sampler(chain, last);
            boolean[] bits = new boolean[last + 1];
            for (int s = 0; s < shots; s++) {
                sampler.draw(rng::nextDouble, bits);
                for (int c = 0; c < width; c++) {
                    reg[c] = source[c] >= 0 && bits[source[c]];
                }
                outcomes.add(reg, 1);
            }
            return outcomes.build();
        }
        List<Instruction> list = circuit.instructions();
        int first = firstClassical(list);
        backend.gates(list, 0, first);
        ClassicalState classical = new ClassicalState(width, circuit.variables().size());
        for (int s = 0; s < shots; s++) {
            backend.use(chain.copy());
            classical.clear();
            ShotRunner.run(list, first, classical, circuit.variables(), backend);
            classical.copyBits(reg);
            outcomes.add(reg, 1);
        }
        return outcomes.build();
    }

    @Override
    public void requireSettings(int bondLimit, double truncation) {
        MatrixProductState.requireSettings(bondLimit, truncation);
    }

    @Override
    public MatrixProductState stateAfter(Circuit circuit, long seed, int bondLimit,
            double truncation) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        Backend backend = new Backend(Chain.zero(circuit.qubits(), bondLimit, truncation), rng);
        ShotRunner.run(circuit.instructions(), 0, new ClassicalState(circuit.clbits(),
                circuit.variables().size()), circuit.variables(), backend);
        return new MatrixProductState(backend.chain());
    }
}
