package dev.qsim.stabilizer;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.IdentityHashMap;
import java.util.List;
import java.util.Map;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

import dev.qsim.Circuit;
import dev.qsim.Gate;
import dev.qsim.Instruction;
import dev.qsim.Tally;
import dev.qsim.internal.Bridge;
import dev.qsim.internal.ClassicalState;
import dev.qsim.internal.Heap;
import dev.qsim.internal.ShotRunner;

/**
 * The stabilizer engine behind {@link dev.qsim.Simulator}: runs Clifford circuits on a
 * {@link StabilizerTableau}. Each gate is applied as its catalogue decomposition into the
 * tableau's primitive gates ({@link Gate#cliffordSteps(double...)}), equal up to a global phase.
 *
 * <p><b>How shots are taken.</b> In a stabilizer circuit the generators' bits evolve the same
 * way in every shot; only the stabilizer signs depend on the outcomes, and they change by XOR
 * with masks fixed by the bits (Aaronson and Gottesman 2004, section III). So a circuit without
 * conditions is simulated once, recording for each measurement or reset how it changes the sign
 * column: the XOR of the gates since the previous one, the pivot and multiplied rows of a random
 * outcome, or the rows whose product gives a deterministic outcome. Each shot then replays only
 * the sign column with fresh random outcomes, 64 shots at a time in bit-sliced form (one
 * {@code long} per stabilizer holds its sign in 64 shots), so a shot costs about the number of
 * rows each measurement touches divided by 64. A circuit with classical control (conditions,
 * loops, assignments) is simulated shot by shot, the gates before its first other instruction
 * once and copied per shot.
 * Randomness: the XoRoShiRo128++ generator of Commons RNG (Blackman and Vigna, "Scrambled
 * linear pseudorandom number generators", ACM TOMS 47 (2021), doi:10.1145/3460772), one bit per
 * random outcome.
 */
final class TableauEngine implements Bridge.Tableaus {
    /** Primitive codes of a compiled gate: opcode, first qubit, second qubit (or -1). */
    private static final int H = 0;
    private static final int S = 1;
    private static final int S_DAGGER = 2;
    private static final int X = 3;
    private static final int Y = 4;
    private static final int Z = 5;
    private static final int CNOT = 6;
    private static final int CZ = 7;
    private static final int SWAP = 8;
    /** The widest register whose shots are tallied as one key each ({@code Tally.fromShots}). */
    private static final int MAX_KEY_WIDTH = 63;

    /** One compiled instruction of a circuit without classical control. */
    static final class Op {
        final Instruction.Kind kind;
        /** Gates: triples (code, a, b). */
        final int[] program;
        final int qubit;
        final int clbit;

        Op(Instruction.Kind kind, int[] program, int qubit, int clbit) {
            this.kind = kind;
            this.program = program;
            this.qubit = qubit;
            this.clbit = clbit;
        }

        void gate(StabilizerTableau t) {
            apply(t, program);
        }
    }

    /** Applies a compiled gate program: triples (code, a, b). */
    static void apply(StabilizerTableau t, int[] p) {
        for (int i = 0; i < p.length; i += 3) {
            int a = p[i + 1];
            int b = p[i + 2];
            switch (p[i]) {
                case H:
                    t.hRaw(a);
                    break;
                case S:
                    t.sRaw(a);
                    break;
                case S_DAGGER:
                    t.sDaggerRaw(a);
                    break;
                case X:
                    t.xRaw(a);
                    break;
                case Y:
                    t.yRaw(a);
                    break;
                case Z:
                    t.zRaw(a);
                    break;
                case CNOT:
                    t.cnotRaw(a, b);
                    break;
                case CZ:
                    t.czRaw(a, b);
                    break;
                default:
                    t.swapRaw(a, b);
                    break;
            }
        }
    }

    /** The code of a primitive gate of a Clifford decomposition. */
    private static int code(Gate g) {
        int c = List.of(Gate.H, Gate.S, Gate.S_DAGGER, Gate.X, Gate.Y, Gate.Z, Gate.CNOT,
                Gate.CZ, Gate.SWAP).indexOf(g);
        if (c < 0) {
            throw new IllegalStateException("internal error: " + g + " is not a primitive");
        }
        return c;
    }

    /** Compiles one Clifford gate (checked by the caller) into primitive triples. */
    static int[] compileGate(Instruction in) {
        List<Gate.Step> steps = in.gate().cliffordSteps(in.angles());
        int[] qs = in.qubits();
        int[] p = new int[3 * steps.size()];
        for (int s = 0; s < steps.size(); s++) {
            Gate.Step st = steps.get(s);
            p[3 * s] = code(st.gate());
            p[3 * s + 1] = qs[st.first()];
            p[3 * s + 2] = st.second() < 0 ? -1 : qs[st.second()];
        }
        return p;
    }

    /**
     * Compiles the gates, measurements and resets of a circuit without classical control into
     * tableau programs; delays are dropped (a tableau has no notion of time).
     */
    static Op[] compile(List<Instruction> list) {
        List<Op> out = new ArrayList<>(list.size());
        for (Instruction in : list) {
            switch (in.kind()) {
                case GATE:
                    out.add(new Op(in.kind(), compileGate(in), -1, -1));
                    break;
                case MEASURE:
                case RESET:
                    out.add(new Op(in.kind(), null, in.targets()[0], in.clbit()));
                    break;
                case DELAY:
                    break;
                default:
                    throw new IllegalStateException("internal error: " + in.kind()
                            + " needs the shot-by-shot path");
            }
        }
        return out.toArray(new Op[0]);
    }

    /** Tells whether any instruction reads or writes classical values during the shot. */
    private static boolean controlled(List<Instruction> list) {
        for (Instruction in : list) {
            switch (in.kind()) {
                case GATE:
                case MEASURE:
                case RESET:
                case DELAY:
                    break;
                default:
                    return true;
            }
        }
        return false;
    }

    /** The tableau side of the shot interpreter; compiled gates are cached per instruction. */
    private static final class Backend implements ShotRunner.Backend {
        private final Map<Instruction, int[]> compiled = new IdentityHashMap<>();
        private final UniformRandomProvider rng;
        private StabilizerTableau t;

        Backend(UniformRandomProvider rng) {
            this.rng = rng;
        }

        @Override
        public void gates(List<Instruction> list, int from, int to) {
            for (int i = from; i < to; i++) {
                apply(t, compiled.computeIfAbsent(list.get(i), TableauEngine::compileGate));
            }
        }

        @Override
        public void gate(Instruction gate, double[] angles) {
            throw new IllegalStateException("internal error: a gate with angles known only"
                    + " during the shot reached the stabilizer engine");
        }

        @Override
        public boolean measure(Instruction measure) {
            return t.measureRaw(measure.targets()[0], rng) == 1;
        }

        @Override
        public void reset(Instruction reset) {
            int q = reset.targets()[0];
            if (t.measureRaw(q, rng) == 1) {
                t.xRaw(q);
            }
        }
    }

    @Override
    public StabilizerTableau stateAfter(Circuit circuit, long seed) {
        Backend backend = new Backend(RandomSource.XO_RO_SHI_RO_128_PP.create(seed));
        backend.t = StabilizerTableau.zero(circuit.qubits());
        ShotRunner.run(circuit.instructions(), 0,
                new ClassicalState(circuit.clbits(), circuit.variables().size()),
                circuit.variables(), backend);
        return backend.t;
    }

    @Override
    public Tally run(Circuit circuit, int shots, long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        List<Instruction> list = circuit.instructions();
        StabilizerTableau t = StabilizerTableau.zero(circuit.qubits());
        boolean[] reg = new boolean[circuit.clbits()];
        if (!controlled(list)) {
            SignReplay replay = SignReplay.record(t, compile(list));
            long[] bits = new long[reg.length];
            if (reg.length <= MAX_KEY_WIDTH) {
                // One key per shot, assembled without a branch on any outcome bit: the bits are
                // random, and a branch on each cost about twice the replay's own time.
                Heap.require(16L * shots, "the outcomes of " + shots + " shots");
                long[] keys = new long[shots];
                for (int done = 0; done < shots; done += 64) {
                    int batch = Math.min(64, shots - done);
                    replay.batch(batch, bits, rng);
                    for (int c = 0; c < reg.length; c++) {
                        final long w = bits[c];
                        for (int s = 0; s < batch; s++) {
                            keys[done + s] |= ((w >>> s) & 1L) << c;
                        }
                    }
                }
                return Tally.fromShots(reg.length, keys);
            }
            Tally.Recorder outcomes = Tally.recorder(reg.length);
            for (int done = 0; done < shots; done += 64) {
                int batch = Math.min(64, shots - done);
                replay.batch(batch, bits, rng);
                for (int s = 0; s < batch; s++) {
                    for (int c = 0; c < reg.length; c++) {
                        reg[c] = ((bits[c] >>> s) & 1L) != 0;
                    }
                    outcomes.add(reg, 1);
                }
            }
            return outcomes.build();
        }
        Tally.Recorder outcomes = Tally.recorder(reg.length);
        Backend backend = new Backend(rng);
        backend.t = t;
        int first = 0;
        while (first < list.size() && list.get(first).kind() == Instruction.Kind.GATE) {
            first++;
        }
        backend.gates(list, 0, first);
        StabilizerTableau work = t.copy();
        backend.t = work;
        ClassicalState classical = new ClassicalState(reg.length, circuit.variables().size());
        for (int s = 0; s < shots; s++) {
            work.copyFrom(t);
            classical.clear();
            ShotRunner.run(list, first, classical, circuit.variables(), backend);
            classical.copyBits(reg);
            outcomes.add(reg, 1);
        }
        return outcomes.build();
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
        static SignReplay record(StabilizerTableau t, Op[] program) {
            final int half = t.halfWords();
            long[] snapshot = new long[half];
            List<Step> steps = new ArrayList<>();
            for (Op op : program) {
                if (op.kind == Instruction.Kind.GATE) {
                    op.gate(t);
                    continue;
                }
                Step step = new Step();
                long[] signs = t.signsRaw();
                long[] d = new long[half];
                for (int w = 0; w < half; w++) {
                    d[w] = signs[w] ^ snapshot[w];
                }
                step.before = orNull(d);
                int q = op.qubit;
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
                if (op.kind == Instruction.Kind.MEASURE) {
                    step.clbit = op.clbit;
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
                    draws[k] |= (rng.nextBoolean() ? 1L : 0L) << s;
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
