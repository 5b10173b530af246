package dev.qsim.bench;

import java.util.ArrayList;
import java.util.List;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

import dev.qsim.Circuit;
import dev.qsim.Precision;
import dev.qsim.Simulator;
import dev.qsim.noise.Channel;
import dev.qsim.noise.NoiseModel;

/**
 * The fixed validation set of the forecast accuracy report: circuits of 16 to 28 qubits (and
 * noisy ones within the density matrix's reach, and wide Clifford ones for the tableau) made
 * from one seed, with their run settings. Gate mixes: rotation layers with CZ bricks, Clifford
 * plus T with CNOTs on random pairs, diagonal-heavy phase circuits, far-apart two-qubit gates,
 * mid-circuit measurement, Clifford circuits. Invented workloads, never expected values.
 */
final class ForecastSet {
    /** The seed of every circuit. */
    static final long SEED = 20261205L;

    /**
     * One case: a circuit and how it is run.
     *
     * @param name a short label
     * @param circuit the circuit
     * @param simulator the run's settings
     * @param shots the shots
     */
    record Case(String name, Circuit circuit, Simulator simulator, int shots) {
    }

    private ForecastSet() {
    }

    /** The cases up to {@code maxQubits} qubits of state vector, in a fixed order. */
    static List<Case> cases(int maxQubits, int threads) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(SEED);
        List<Case> out = new ArrayList<>();
        Simulator ideal = Simulator.seeded(SEED).withThreads(threads);
        String[] mixes = {"rotations", "clifford+t", "phases", "far-pairs"};
        int[] sizes = {16, 18, 20, 22, 24, 26, 28};
        int[] depths = {4, 12, 30};
        for (int n : sizes) {
            if (n > maxQubits) {
                continue;
            }
            for (int m = 0; m < mixes.length; m++) {
                int depth = depths[(n / 2 + m) % depths.length];
                if (n >= 26) {
                    depth = Math.min(depth, 12);
                    if (m % 2 == 1) {
                        continue;
                    }
                }
                Circuit c = mix(mixes[m], n, depth, rng).measure().build();
                out.add(new Case(mixes[m] + " n=" + n + " d=" + depth, c, ideal, 1000));
            }
        }
        // Single precision, one thread, no fusion.
        for (int n : new int[] {18, 22, 26, 28}) {
            if (n <= maxQubits) {
                out.add(new Case("rotations single n=" + n, mix("rotations", n, 8, rng)
                        .measure().build(), ideal.withPrecision(Precision.SINGLE), 1000));
            }
        }
        for (int n : new int[] {16, 20, 24}) {
            out.add(new Case("clifford+t 1 thread n=" + n, mix("clifford+t", n, 12, rng)
                    .measure().build(), ideal.withThreads(1), 1000));
            out.add(new Case("phases unfused n=" + n, mix("phases", n, 5, rng).measure()
                    .build(), ideal.withFusion(false), 1000));
        }
        // Mid-circuit measurement: shot by shot.
        for (int n : new int[] {16, 18, 20}) {
            Circuit.Builder b = mix("rotations", n, 6, rng);
            b.measure(0, 0);
            b.ifBit(0, 1, t -> t.x(1));
            mixInto(b, "rotations", n, 2, rng);
            out.add(new Case("mid-circuit n=" + n, b.measure().build(), ideal, 20));
        }
        // Noise: trajectories and density matrices.
        NoiseModel noise = NoiseModel.builder().afterOneQubitGates(Channel.depolarizing(0.01))
                .afterTwoQubitGates(Channel.twoQubitDepolarizing(0.02)).build();
        for (int n : new int[] {16, 18, 20}) {
            out.add(new Case("trajectories n=" + n, mix("clifford+t", n, 6, rng).measure().build(),
                    ideal.withNoise(noise), n == 20 ? 12 : 40));
        }
        NoiseModel damping = NoiseModel.builder()
                .afterOneQubitGates(Channel.amplitudeDamping(0.02)).build();
        out.add(new Case("trajectories damping n=16", mix("rotations", 16, 6, rng).measure()
                .build(), ideal.withNoise(damping), 40));
        for (int n : new int[] {8, 9, 10, 11}) {
            out.add(new Case("density matrix n=" + n, mix("rotations", n, 6, rng).measure()
                    .build(), ideal.withNoise(noise).withEngine(Simulator.Engine.DENSITY_MATRIX),
                    1000));
        }
        // Clifford circuits: the tableau.
        for (int n : new int[] {20, 28, 200, 600, 1000}) {
            out.add(new Case("clifford n=" + n, mix("clifford", n, 20, rng).measure().build(),
                    ideal, 1000));
        }
        out.add(new Case("clifford 20000 shots n=400", mix("clifford", 400, 10, rng).measure()
                .build(), ideal, 20000));
        return out;
    }

    /** A circuit of one mix, unfinished so that measurements may be added. */
    static Circuit.Builder mix(String mix, int n, int depth, UniformRandomProvider rng) {
        Circuit.Builder b = Circuit.builder(n);
        mixInto(b, mix, n, depth, rng);
        return b;
    }

    private static void mixInto(Circuit.Builder b, String mix, int n, int depth,
            UniformRandomProvider rng) {
        for (int layer = 0; layer < depth; layer++) {
            switch (mix) {
                case "rotations":
                    for (int q = 0; q < n; q++) {
                        b.ry(q, angle(rng));
                        b.rz(q, angle(rng));
                    }
                    for (int q = layer % 2; q + 1 < n; q += 2) {
                        b.cz(q, q + 1);
                    }
                    break;
                case "clifford+t":
                    for (int q = 0; q < n; q++) {
                        int r = rng.nextInt(3);
                        if (r == 0) {
                            b.h(q);
                        } else if (r == 1) {
                            b.t(q);
                        } else {
                            b.sqrtX(q);
                        }
                    }
                    for (int k = 0; k < n / 2; k++) {
                        int a = rng.nextInt(n);
                        int c = (a + 1 + rng.nextInt(n - 1)) % n;
                        b.cnot(a, c);
                    }
                    break;
                case "phases":
                    if (layer == 0) {
                        for (int q = 0; q < n; q++) {
                            b.h(q);
                        }
                    }
                    for (int q = 0; q < n; q++) {
                        b.rz(q, angle(rng));
                        int c = (q + 1 + rng.nextInt(n - 1)) % n;
                        b.cphase(q, c, angle(rng));
                    }
                    b.rx(rng.nextInt(n), angle(rng));
                    break;
                case "far-pairs":
                    for (int q = 0; q < n / 2; q++) {
                        b.rx(q, angle(rng));
                        b.cnot(q, q + n / 2);
                        b.ry(q + n / 2, angle(rng));
                    }
                    break;
                default: // clifford
                    for (int q = 0; q < n; q++) {
                        if (rng.nextBoolean()) {
                            b.h(q);
                        } else {
                            b.s(q);
                        }
                    }
                    for (int k = 0; k < n / 2; k++) {
                        int a = rng.nextInt(n);
                        int c = (a + 1 + rng.nextInt(n - 1)) % n;
                        b.cnot(a, c);
                    }
                    break;
            }
        }
    }

    private static double angle(UniformRandomProvider rng) {
        return 0.1 + 2.9 * rng.nextDouble();
    }
}
