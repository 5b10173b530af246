package dev.qsim.stabilizer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Map;
import java.util.Random;
import java.util.TreeSet;

import org.apache.commons.statistics.inference.ChiSquareTest;
import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Gates;
import dev.qsim.Simulator;
import dev.qsim.StateVector;
import dev.qsim.Tally;

/** The stabilizer engine, reached through the run facade ({@code Engine.TABLEAU}). */
class TableauEngineTest {

    private static Simulator tableau(long seed) {
        return Simulator.seeded(seed).withEngine(Simulator.Engine.TABLEAU);
    }

    /** Smallest p-value accepted; with fixed seeds each test either always passes or fails. */
    private static final double ALPHA = 1e-3;

    private static final int SHOTS = 4_000;

    /**
     * Random Clifford circuits with terminal measurements of some or all of up to 12 qubits:
     * outcomes of probability zero under the state-vector engine's exact probabilities (Born
     * rule, Nielsen and Chuang 2010, sec. 2.2.3) never occur, and where there are at most 256
     * possible outcomes the tally fits those probabilities by a chi-square goodness-of-fit test
     * (Commons Statistics ChiSquareTest).
     */
    @Test
    void terminalMeasurementsFitTheStateVectorProbabilities() {
        long seed = 31_337L;
        Random rnd = new Random(seed);
        for (int trial = 0; trial < 40; trial++) {
            int n = 1 + rnd.nextInt(12);
            int measured = trial % 2 == 0 ? n : 1 + rnd.nextInt(Math.min(n, 6));
            Circuit.Builder gates = Circuit.builder(n, measured);
            RandomCliffords.gates(rnd, n, 10 + rnd.nextInt(60), gates, null);
            StateVector psi = StateVector.zero(n).apply(gates.build());
            int[] qubits = new int[measured];
            int[] perm = shuffled(rnd, n);
            for (int c = 0; c < measured; c++) {
                qubits[c] = perm[c];
                gates.measure(qubits[c], c);
            }
            Circuit circuit = gates.build();
            // marginal(qubits): qubits[j] is bit j of the index, clbit j receives qubits[j].
            double[] p = psi.marginal(qubits);
            Tally tally = tableau(seed + trial).run(circuit, SHOTS);
            assertEquals(SHOTS, tally.shots());
            checkFit(p, tally, "seed " + seed + " trial " + trial + " " + circuit);
        }
    }

    /**
     * Many short random circuits on 2 to 4 qubits, all measured: every outcome seen has nonzero
     * probability in the state-vector engine's exact state (Born rule, Nielsen and Chuang 2010,
     * sec. 2.2.3). Short circuits often leave the pivot and another stabilizer with different
     * Paulis on the measured qubit, the case where the product's phase matters.
     */
    @Test
    void everyOutcomeOfShortCircuitsIsPossible() {
        long seed = 2_718L;
        Random rnd = new Random(seed);
        for (int trial = 0; trial < 1_500; trial++) {
            int n = 2 + rnd.nextInt(3);
            Circuit.Builder b = Circuit.builder(n);
            RandomCliffords.gates(rnd, n, 6 + rnd.nextInt(12), b, null);
            StateVector psi = StateVector.zero(n).apply(b.build());
            Circuit c = b.measure().build();
            Tally t = tableau(seed + trial).run(c, 32);
            for (String k : t.outcomes().keySet()) {
                final int tr = trial;
                assertTrue(psi.probability(Long.parseLong(k, 2)) > 1e-12,
                        () -> "seed " + seed + " trial " + tr + " outcome " + k + ": " + c);
            }
        }
    }

    private static void checkFit(double[] p, Tally tally, String what) {
        int support = 0;
        for (double v : p) {
            support += v > 1e-12 ? 1 : 0;
        }
        double[] expected = new double[support];
        long[] observed = new long[support];
        int k = 0;
        for (int i = 0; i < p.length; i++) {
            if (p[i] > 1e-12) {
                expected[k] = p[i];
                observed[k++] = tally.count(i);
            } else {
                assertEquals(0, tally.count(i), () -> "impossible outcome seen: " + what);
            }
        }
        if (support > 1 && support <= 256) {
            double pValue = ChiSquareTest.withDefaults().test(expected, observed).getPValue();
            assertTrue(pValue > ALPHA, () -> "p = " + pValue + ": " + what);
        } else if (support == 1) {
            assertEquals(tally.shots(), observed[0], what);
        }
    }

    /**
     * Random Clifford circuits with mid-circuit measurements, resets and conditioned blocks on
     * up to 8 qubits: the tallies of this engine and of the state-vector engine
     * (Simulator.seeded(..).run) pass a two-sample chi-square test (Commons Statistics
     * ChiSquareTest), and every clbit that is constant in one tally is constant with the same
     * value in the other (deterministic outcomes agree).
     */
    @Test
    void midCircuitMeasurementsAgreeWithTheStateVectorEngine() {
        long seed = 8_675_309L;
        Random rnd = new Random(seed);
        for (int trial = 0; trial < 30; trial++) {
            int n = 1 + rnd.nextInt(8);
            int clbits = 1 + rnd.nextInt(5);
            Circuit.Builder b = Circuit.builder(n, clbits);
            int events = 1 + rnd.nextInt(5);
            boolean conditions = trial % 2 == 1;
            for (int e = 0; e < events; e++) {
                RandomCliffords.gates(rnd, n, rnd.nextInt(12), b, null);
                int q = rnd.nextInt(n);
                int c = rnd.nextInt(clbits);
                switch (rnd.nextInt(conditions ? 3 : 2)) {
                    case 0:
                        b.measure(q, c);
                        break;
                    case 1:
                        b.reset(q);
                        break;
                    default:
                        b.ifBit(c, rnd.nextInt(2), then -> {
                            RandomCliffords.gates(rnd, n, 1 + rnd.nextInt(4), then, null);
                            then.measure(rnd.nextInt(n), rnd.nextInt(clbits));
                        });
                        break;
                }
            }
            RandomCliffords.gates(rnd, n, rnd.nextInt(10), b, null);
            for (int c = 0; c < clbits; c++) {
                b.measure(rnd.nextInt(n), c);
            }
            Circuit circuit = b.build();
            Tally mine = tableau(seed + trial).run(circuit, SHOTS);
            Tally reference = Simulator.seeded(seed - trial).withThreads(1).run(circuit, SHOTS);
            String what = "seed " + seed + " trial " + trial + " " + circuit;
            compare(mine, reference, what);
        }
    }

    private static void compare(Tally a, Tally b, String what) {
        TreeSet<String> keys = new TreeSet<>(a.outcomes().keySet());
        keys.addAll(b.outcomes().keySet());
        int width = a.width();
        for (int c = 0; c < width; c++) {
            int pos = width - 1 - c;
            long onesA = 0;
            long onesB = 0;
            for (Map.Entry<String, Long> e : a.outcomes().entrySet()) {
                onesA += e.getKey().charAt(pos) == '1' ? e.getValue() : 0;
            }
            for (Map.Entry<String, Long> e : b.outcomes().entrySet()) {
                onesB += e.getKey().charAt(pos) == '1' ? e.getValue() : 0;
            }
            boolean constA = onesA == 0 || onesA == a.shots();
            boolean constB = onesB == 0 || onesB == b.shots();
            final int cb = c;
            assertEquals(constA, constB, () -> "clbit " + cb + " determinism differs: " + what);
            if (constA) {
                assertEquals(onesA, onesB, () -> "clbit " + cb + " value differs: " + what);
            }
        }
        if (keys.size() > 1) {
            long[] x = new long[keys.size()];
            long[] y = new long[keys.size()];
            int k = 0;
            for (String key : keys) {
                x[k] = a.count(key);
                y[k++] = b.count(key);
            }
            double pValue = ChiSquareTest.withDefaults().test(x, y).getPValue();
            assertTrue(pValue > ALPHA, () -> "p = " + pValue + ": " + what);
        }
    }

    private static int[] shuffled(Random rnd, int n) {
        int[] a = new int[n];
        for (int i = 0; i < n; i++) {
            a[i] = i;
        }
        for (int i = n - 1; i > 0; i--) {
            int j = rnd.nextInt(i + 1);
            int t = a[i];
            a[i] = a[j];
            a[j] = t;
        }
        return a;
    }

    /**
     * A 1,000-qubit GHZ state: in the Z basis all bits agree in every shot; in the X basis the
     * parity is even in every shot, since X on every qubit stabilizes it (Greenberger, Horne,
     * Shimony and Zeilinger, "Bell's theorem without inequalities", Am. J. Phys. 58, 1131
     * (1990); common practice). Both outcomes of the Z basis occur.
     */
    @Test
    void thousandQubitGhz() {
        int n = 1_000;
        Circuit.Builder b = Circuit.builder(n).h(0);
        for (int q = 1; q < n; q++) {
            b.cnot(q - 1, q);
        }
        Circuit ghz = b.build();
        Tally z = tableau(11L).run(Circuit.builder(n).append(ghz).measure().build(), 40);
        assertEquals(2, z.outcomes().size(), z.outcomes().keySet()::toString);
        assertEquals(40, z.count("0".repeat(n)) + z.count("1".repeat(n)));
        Circuit.Builder xb = Circuit.builder(n).append(ghz);
        for (int q = 0; q < n; q++) {
            xb.h(q);
        }
        Tally x = tableau(12L).run(xb.measure().build(), 40);
        assertEquals(40, x.outcomes().size(), "X-basis outcomes should all differ");
        for (Map.Entry<String, Long> e : x.outcomes().entrySet()) {
            long ones = e.getKey().chars().filter(ch -> ch == '1').count();
            assertEquals(0, ones % 2, e.getKey());
        }
    }

    /**
     * The replay of signs and the shot-by-shot path draw one random bit per random outcome in
     * the same order, so with equal seeds they must give equal tallies, shot for shot (a
     * property of this implementation, checked on random circuits of 150 qubits with gates
     * between measurements and resets, with 6 classical bits (the replay's outcomes tallied as
     * one key per shot) and with 70 (wider than a key: tallied as bitstrings)).
     */
    @Test
    void replayEqualsShotByShotForEqualSeeds() {
        long seed = 606L;
        Random rnd = new Random(seed);
        int n = 150;
        for (int trial = 0; trial < 4; trial++) {
            int width = trial < 3 ? 6 : 70;
            Circuit.Builder b = Circuit.builder(n, width);
            RandomCliffords.gates(rnd, n, 2_000, b, null);
            for (int k = 0; k < 40; k++) {
                int q = rnd.nextInt(n);
                if (rnd.nextInt(4) == 0) {
                    b.reset(q);
                } else {
                    b.measure(q, rnd.nextInt(width));
                }
                RandomCliffords.gates(rnd, n, rnd.nextInt(200), b, null);
            }
            b.measure(70, 5).reset(70).measure(70, 4);
            Circuit plain = b.build();
            // The same circuit plus an if block that never runs (clbit 4 reads 0 after the
            // reset) and draws nothing: this forces the shot-by-shot path.
            Circuit conditioned = Circuit.builder(n, width).append(plain)
                    .ifBit(4, 1, then -> then.x(0)).build();
            // 130 shots: two full batches of 64 in the replay and a partial one.
            Tally a = tableau(seed + trial).run(plain, 130);
            Tally c = tableau(seed + trial).run(conditioned, 130);
            assertEquals(c, a, "seed " + seed + " trial " + trial);
            assertTrue(a.outcomes().size() > 1, "seed " + seed + " trial " + trial);
            for (String k : a.outcomes().keySet()) {
                // Reset then measure reads 0 (definition of reset, common practice).
                assertEquals('0', k.charAt(width - 1 - 4), k);
            }
        }
    }

    @Test
    void equalSeedsGiveEqualTallies() {
        Circuit c = Circuit.builder(5).h(0).cnot(0, 1).h(2).cz(2, 3).s(4).h(4).measure().build();
        assertEquals(tableau(3L).run(c, 500), tableau(3L).run(c, 500));
    }

    @Test
    void isCliffordTellsWhichCircuitsRun() {
        assertTrue(Circuit.builder(2).h(0).sqrtX(1).cnot(0, 1)
                .sDagger(0).swap(0, 1).reset(1).measure().ifBit(0, 1, t -> t.y(1)).build()
                .isClifford());
        assertFalse(Circuit.builder(2).h(0).t(1).build().isClifford());
        assertFalse(Circuit.builder(1, 1).measure(0, 0)
                .ifBit(0, 1, t -> t.rz(0, 0.1)).build().isClifford());
        // The catalogue decides, with angles: rz(pi/2) is S up to phase, and an operator equal
        // to a catalogue matrix is that gate (Gottesman 1998, the Clifford group).
        assertTrue(Circuit.builder(1).apply(Gates.H, 0).rz(0, Math.PI / 2).ry(0, -Math.PI)
                .build().isClifford());
        assertFalse(Circuit.builder(1).rz(0, Math.PI / 4).build().isClifford());
    }

    @Test
    void nonCliffordGateIsRefusedWithNameAndPosition() {
        Circuit c = Circuit.builder(3).h(0).cnot(0, 1).rx(2, 0.5).build();
        IllegalArgumentException e =
                assertThrows(IllegalArgumentException.class, () -> tableau(1).run(c, 10));
        assertTrue(e.getMessage().contains("instruction 2 (rx"), e.getMessage());
        Circuit nested = Circuit.builder(3, 1).measure(0, 0)
                .ifBit(0, 1, t -> t.h(1).toffoli(0, 1, 2)).build();
        IllegalArgumentException g = assertThrows(IllegalArgumentException.class,
                () -> tableau(1).run(nested, 1));
        assertTrue(g.getMessage().contains("step 1 (toffoli"), g.getMessage());
        Circuit inner = Circuit.builder(2, 2).measure(0, 0).ifBit(0, 1, t -> t.h(1).t(1)).build();
        IllegalArgumentException f = assertThrows(IllegalArgumentException.class,
                () -> tableau(1).stateAfter(inner));
        assertTrue(f.getMessage().contains("instruction 1 (if), step 1 (t"), f.getMessage());
    }

    @Test
    void zeroShotsAreRefused() {
        Circuit c = Circuit.builder(1).h(0).measure().build();
        IllegalArgumentException e =
                assertThrows(IllegalArgumentException.class, () -> tableau(1).run(c, 0));
        assertTrue(e.getMessage().contains("0"), e.getMessage());
    }

    @Test
    void stateAfterMatchesTheStateVectorEngineForGates() {
        Circuit c = Circuit.builder(3).h(0).cnot(0, 1).s(1).cz(1, 2).sqrtX(2).build();
        StateVector expected = StateVector.zero(3).apply(c);
        assertEquals(1.0, tableau(0).stateAfter(c).fidelity(expected),
                1e-12);
    }
}
