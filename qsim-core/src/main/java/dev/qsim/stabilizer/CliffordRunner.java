package dev.qsim.stabilizer;

import java.util.ArrayList;
import dev.qsim.kernel.Args;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

import dev.qsim.Circuit;
import dev.qsim.Instruction;
import dev.qsim.Tally;

/**
 * Runs Clifford circuits on a {@link GeneratorTable}: checks that a circuit is made only of
 * Clifford gates, measurements, resets and conditions, and samples its shots. Stateless and
 * thread-safe; every call starts from its seed, so equal calls give equal results.
 *
 * <p><b>Accepted instructions</b>, by {@link Instruction#name()}: the gates {@code h x y z s
 * sDagger sqrtX cnot cz swap}, {@code measure}, {@code reset}, and {@code if} blocks whose bodies
 * hold only these. Any other gate ({@code t}, {@code rx}, {@code toffoli}, {@code apply} ...)
 * is refused, even where its matrix happens to be Clifford.
 *
 * <p><b>How shots are taken.</b> In a stabilizer circuit the generators' bits evolve the same
 * way in every shot; only the stabilizer signs depend on the outcomes, and they change by XOR
 * with masks fixed by the bits (Aaronson and Gottesman 2004, section III). So a circuit without
 * conditions is simulated once, recording for each measurement or reset how it changes the sign
 * column: the XOR of the gates since the previous one, the pivot and multiplied rows of a random
 * outcome, or the rows whose product gives a deterministic outcome. Each shot then replays only
 * the sign column with fresh random outcomes, 64 shots at a time in bit-sliced form (one
 * {@code long} per stabilizer holds its sign in 64 shots), so a shot costs about the number of
 * rows each measurement touches divided by 64. A circuit with {@code if} blocks is simulated
 * shot by shot, the gates before its first measurement or reset
 * once and copied per shot. Randomness: the XoRoShiRo128++ generator of Commons RNG (Blackman
 * and Vigna, "Scrambled linear pseudorandom number generators", ACM TOMS 47 (2021),
 * doi:10.1145/3460772), one bit per random outcome.
 *
 * @since 0.2
 */
public final class CliffordRunner {
    private static final String ACCEPTED = "the stabilizer engine accepts h, x, y, z, s, sDagger,"
            + " sqrtX, cnot, cz, swap, measure, reset and if blocks of these";

    private CliffordRunner() {
    }

    /**
     * Tells whether the stabilizer engine can run a circuit (see the class documentation).
     *
     * @param circuit the circuit
     * @return true if every instruction, also inside {@code if} blocks, is accepted
     */
    public static boolean isClifford(Circuit circuit) {
        Objects.requireNonNull(circuit, "circuit");
        return firstRefused(circuit.instructions(), "") == null;
    }

    /**
     * Checks that the stabilizer engine can run a circuit.
     *
     * @param circuit the circuit
     * @throws IllegalArgumentException naming the first refused gate and its position (index
     *     in {@link Circuit#instructions()} from 0, and step within an {@code if} block)
     */
    public static void requireClifford(Circuit circuit) {
        Objects.requireNonNull(circuit, "circuit");
        String refused = firstRefused(circuit.instructions(), "");
        if (refused != null) {
            throw new IllegalArgumentException(refused);
        }
    }

    private static String firstRefused(List<Instruction> list, String where) {
        for (int i = 0; i < list.size(); i++) {
            Instruction in = list.get(i);
            String here = where + (where.isEmpty() ? "instruction " : ", step ") + i;
            if (in.kind() == Instruction.Kind.IF_BIT) {
                String inner = firstRefused(in.body(), here + " (if)");
                if (inner != null) {
                    return inner;
                }
            } else if (in.kind() == Instruction.Kind.GATE && gateCode(in) < 0) {
                return here + " (" + in.name() + ") is not a Clifford gate: " + ACCEPTED;
            }
        }
        return null;
    }

    private static final int H = 0;
    private static final int X = 1;
    private static final int Y = 2;
    private static final int Z = 3;
    private static final int S = 4;
    private static final int S_DAGGER = 5;
    private static final int SQRT_X = 6;
    private static final int CNOT = 7;
    private static final int CZ = 8;
    private static final int SWAP = 9;

    private static int gateCode(Instruction in) {
        int controls = in.controls().length;
        switch (in.name()) {
            case "h":
                return controls == 0 ? H : -1;
            case "x":
                return controls == 0 ? X : -1;
            case "y":
                return controls == 0 ? Y : -1;
            case "z":
                return controls == 0 ? Z : -1;
            case "s":
                return controls == 0 ? S : -1;
            case "sDagger":
                return controls == 0 ? S_DAGGER : -1;
            case "sqrtX":
                return controls == 0 ? SQRT_X : -1;
            case "cnot":
                return controls == 1 ? CNOT : -1;
            case "cz":
                return controls == 0 ? CZ : -1;
            case "swap":
                return controls == 0 ? SWAP : -1;
            default:
                return -1;
        }
    }

    /** Applies one accepted gate, unchecked. */
    static void gate(GeneratorTable t, Instruction in) {
        int[] q = in.targets();
        switch (gateCode(in)) {
            case H:
                t.hRaw(q[0]);
                break;
            case X:
                t.xRaw(q[0]);
                break;
            case Y:
                t.yRaw(q[0]);
                break;
            case Z:
                t.zRaw(q[0]);
                break;
            case S:
                t.sRaw(q[0]);
                break;
            case S_DAGGER:
                t.sDaggerRaw(q[0]);
                break;
            case SQRT_X:
                t.hRaw(q[0]);
                t.sRaw(q[0]);
                t.hRaw(q[0]);
                break;
            case CNOT:
                t.cnotRaw(in.controls()[0], q[0]);
                break;
            case CZ:
                t.czRaw(q[0], q[1]);
                break;
            case SWAP:
                t.swapRaw(q[0], q[1]);
                break;
            default:
                throw new IllegalArgumentException(in.name() + " is not a Clifford gate: "
                        + ACCEPTED);
        }
    }

    /**
     * Runs one seeded shot of a circuit and returns the final stabilizer state.
     *
     * @param circuit a Clifford circuit
     * @param seed the seed of the random outcomes
     * @return the state after the shot
     * @throws IllegalArgumentException if the circuit is not Clifford (see
     *     {@link #requireClifford(Circuit)})
     * @throws IllegalStateException if the heap cannot hold the table
     */
    public static GeneratorTable stateAfter(Circuit circuit, long seed) {
        requireClifford(circuit);
        GeneratorTable t = GeneratorTable.zero(circuit.qubits());
        runShot(t, circuit.instructions(), 0, new boolean[circuit.clbits()],
                RandomSource.XO_RO_SHI_RO_128_PP.create(seed));
        return t;
    }

    /**
     * Runs a circuit for a number of shots and tallies its classical bits; bits never written
     * read 0. See the class documentation for how shots are taken.
     *
     * @param circuit a Clifford circuit
     * @param shots the number of shots, at least 1
     * @param seed the seed of the random outcomes
     * @return a tally of width {@code circuit.clbits()}
     * @throws IllegalArgumentException if {@code shots < 1} or the circuit is not Clifford
     * @throws IllegalStateException if the heap cannot hold the table
     */
    public static Tally run(Circuit circuit, int shots, long seed) {
        requireClifford(circuit);
        Args.requirePositiveShots(shots);
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        List<Instruction> list = circuit.instructions();
        boolean conditioned = false;
        for (Instruction in : list) {
            conditioned |= in.kind() == Instruction.Kind.IF_BIT;
        }
        GeneratorTable t = GeneratorTable.zero(circuit.qubits());
        boolean[] reg = new boolean[circuit.clbits()];
        Map<String, Long> counts = new HashMap<>();
        char[] text = new char[reg.length];
        if (!conditioned) {
            SignReplay replay = SignReplay.record(t, list);
            long[] bits = new long[reg.length];
            for (int done = 0; done < shots; done += 64) {
                int batch = Math.min(64, shots - done);
                replay.batch(batch, bits, rng);
                for (int s = 0; s < batch; s++) {
                    for (int c = 0; c < reg.length; c++) {
                        reg[c] = ((bits[c] >>> s) & 1L) != 0;
                    }
                    count(reg, text, counts);
                }
            }
        } else {
            int first = 0;
            while (first < list.size() && list.get(first).kind() == Instruction.Kind.GATE) {
                gate(t, list.get(first));
                first++;
            }
            GeneratorTable work = t.copy();
            for (int s = 0; s < shots; s++) {
                work.copyFrom(t);
                Arrays.fill(reg, false);
                runShot(work, list, first, reg, rng);
                count(reg, text, counts);
            }
        }
        return Tally.of(reg.length, counts);
    }

    private static void count(boolean[] reg, char[] text, Map<String, Long> counts) {
        for (int c = 0; c < reg.length; c++) {
            text[reg.length - 1 - c] = reg[c] ? '1' : '0';
        }
        counts.merge(new String(text), 1L, Long::sum);
    }

    /** Runs instructions from index {@code from} for one shot; clbits in {@code reg}. */
    static void runShot(GeneratorTable t, List<Instruction> list, int from, boolean[] reg,
            UniformRandomProvider rng) {
        for (int i = from; i < list.size(); i++) {
            Instruction in = list.get(i);
            switch (in.kind()) {
                case GATE:
                    gate(t, in);
                    break;
                case MEASURE:
                    reg[in.clbit()] = t.measureRaw(in.targets()[0], rng) == 1;
                    break;
                case RESET:
                    int q = in.targets()[0];
                    if (t.measureRaw(q, rng) == 1) {
                        t.xRaw(q);
                    }
                    break;
                default:
                    if (reg[in.clbit()] == (in.value() == 1)) {
                        runShot(t, in.body(), 0, reg, rng);
                    }
                    break;
            }
        }
    }

    /**
     * The sign column's part of a circuit without conditions, recorded once: per measurement or
     * reset, the XOR the gates before it apply to the signs, then how the outcome is found.
     */
    static final class SignReplay {
        private final int half;
        private final List<Step> steps;
        private final int randomSteps;

        private SignReplay(int half, List<Step> steps) {
            this.half = half;
            this.steps = steps;
            int random = 0;
            for (Step st : steps) {
                random += st.random ? 1 : 0;
            }
            this.randomSteps = random;
        }

        /** One measurement or reset. Arrays are {@code half} words; null stands for zeros. */
        private static final class Step {
            long[] before;
            boolean random;
            int word;
            long bit;
            long[] added;
            long[] rows;
            int exponent;
            long[] select;
            int clbit;
            long[] flip;
        }

        /** Simulates the circuit once on {@code t} (changed), random outcomes taken as 0. */
        static SignReplay record(GeneratorTable t, List<Instruction> list) {
            final int half = t.halfWords();
            long[] snapshot = new long[half];
            List<Step> steps = new ArrayList<>();
            for (Instruction in : list) {
                if (in.kind() == Instruction.Kind.GATE) {
                    gate(t, in);
                    continue;
                }
                Step step = new Step();
                long[] signs = t.signsRaw();
                long[] d = new long[half];
                for (int w = 0; w < half; w++) {
                    d[w] = signs[w] ^ snapshot[w];
                }
                step.before = orNull(d);
                int q = in.targets()[0];
                int p = t.pivot(q);
                int outcome;
                if (p >= 0) {
                    step.random = true;
                    step.word = p >>> 6;
                    step.bit = 1L << (p & 63);
                    t.collapse(q, p, 0);
                    step.added = orNull(t.highRaw().clone());
                    step.rows = orNull(Arrays.copyOfRange(t.maskRaw(), half, 2 * half));
                    outcome = 0;
                } else {
                    step.exponent = t.selectionExponent(q);
                    step.select = Arrays.copyOf(t.maskRaw(), half);
                    outcome = ((step.exponent + 2 * t.signParity(step.select)) >>> 1) & 1;
                }
                if (in.kind() == Instruction.Kind.MEASURE) {
                    step.clbit = in.clbit();
                } else {
                    step.clbit = -1;
                    step.flip = new long[half];
                    t.stabilizerZColumn(q, step.flip);
                    if (outcome == 1) {
                        t.xRaw(q);
                    }
                }
                System.arraycopy(signs, 0, snapshot, 0, half);
                steps.add(step);
            }
            return new SignReplay(half, steps);
        }

        private static long[] orNull(long[] a) {
            for (long v : a) {
                if (v != 0) {
                    return a;
                }
            }
            return null;
        }

        /**
         * Replays up to 64 shots at once, bit-sliced: bit s of each word belongs to shot s.
         * Each shot draws its random outcomes in step order, as the shot-by-shot path does, so
         * equal seeds give equal shots on both paths.
         *
         * @param count shots in this batch, 1 to 64
         * @param bits receives bit s = outcome of shot s per clbit; clbits never written read 0
         * @param rng the source of random outcomes
         */
        void batch(int count, long[] bits, UniformRandomProvider rng) {
            Arrays.fill(bits, 0L);
            long[] draws = new long[randomSteps];
            for (int s = 0; s < count; s++) {
                for (int k = 0; k < randomSteps; k++) {
                    if (rng.nextBoolean()) {
                        draws[k] |= 1L << s;
                    }
                }
            }
            final long[] r = new long[half << 6];
            int k = 0;
            for (int i = 0; i < steps.size(); i++) {
                final Step st = steps.get(i);
                if (st.before != null) {
                    flip(r, st.before, -1L);
                }
                long outcome;
                if (st.random) {
                    final int p = (st.word << 6) + Long.numberOfTrailingZeros(st.bit);
                    final long rp = r[p];
                    if (st.added != null) {
                        flip(r, st.added, -1L);
                    }
                    if (st.rows != null) {
                        flip(r, st.rows, rp);
                    }
                    outcome = draws[k++];
                    r[p] = outcome;
                } else {
                    outcome = ((st.exponent >>> 1) & 1) != 0 ? -1L : 0L;
                    final long[] sel = st.select;
                    for (int w = 0; w < half; w++) {
                        long v = sel[w];
                        while (v != 0) {
                            outcome ^= r[(w << 6) + Long.numberOfTrailingZeros(v)];
                            v &= v - 1;
                        }
                    }
                }
                if (st.clbit >= 0) {
                    bits[st.clbit] = outcome;
                } else {
                    flip(r, st.flip, outcome);
                }
            }
        }

        /** XORs {@code value} into every row of {@code r} selected by {@code rows}. */
        private static void flip(long[] r, long[] rows, long value) {
            for (int w = 0; w < rows.length; w++) {
                long v = rows[w];
                while (v != 0) {
                    r[(w << 6) + Long.numberOfTrailingZeros(v)] ^= value;
                    v &= v - 1;
                }
            }
        }
    }
}
