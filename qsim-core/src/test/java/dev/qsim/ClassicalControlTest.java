package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;

import org.apache.commons.statistics.distribution.GeometricDistribution;
import org.apache.commons.statistics.inference.ChiSquareTest;
import org.junit.jupiter.api.Test;

import dev.qsim.noise.NoiseModel;

/**
 * Classical control during a shot: conditions on expressions, loops, classical variables,
 * assignments, gates whose angles are computed from measured values, and delays, on every
 * engine that runs them, against published protocols and reference distributions.
 */
class ClassicalControlTest {
    private static final double TOL = 1e-12;

    /**
     * Iterative phase estimation with one ancilla (Dobšíček, Johansson, Shumeiko and Wendin
     * 2007, "Arbitrary accuracy iterative quantum phase estimation algorithm using a single
     * ancillary qubit", Phys. Rev. A 76, 030306(R), Fig. 1): the bits of a phase with an exact
     * three-bit expansion are read with certainty, least significant first, each step
     * correcting its phase by the bits already read. The correction is a gate whose angle is
     * computed from measured bits during the shot.
     */
    private static Circuit phaseEstimation(double phase, boolean corrected) {
        Circuit.Builder b = Circuit.builder(2, 3).x(1);
        for (int k = 3; k >= 1; k--) {
            b.h(0);
            b.gate(Gate.CPHASE, new double[] {2 * Math.PI * phase * (1 << (k - 1))}, 0, 1);
            if (corrected && k < 3) {
                // omega_k = -2 pi sum_{j=1}^{3-k} x_{k+j} / 2^{j+1}; bit x_m is in c[m-1].
                Expression sum = Expression.constant(0.0);
                for (int j = 1; j <= 3 - k; j++) {
                    sum = Expression.of(Expression.Op.ADD, sum, Expression.of(Expression.Op.DIV,
                            Expression.clbit(k - 1 + j), Expression.constant((double) (1 << (j
                            + 1)))));
                }
                b.gate(Gate.PHASE, new Expression[] {Expression.of(Expression.Op.MUL,
                        Expression.constant(-2 * Math.PI), sum)}, 0);
            }
            b.h(0).measure(0, k - 1).reset(0);
        }
        return b.build();
    }

    @Test
    void iterativePhaseEstimationReadsAnExactPhaseWithCertainty() {
        // phi = 5/8 = 0.101 in binary: x1 = 1, x2 = 0, x3 = 1, register c2 c1 c0 = 101.
        Circuit ipe = phaseEstimation(5.0 / 8, true);
        double[] p = Simulator.seeded(1).distribution(ipe);
        assertEquals(1, p[0b101], TOL);
        double[] noisy = Simulator.seeded(1).withNoise(NoiseModel.builder().build())
                .distribution(ipe);
        assertEquals(1, noisy[0b101], TOL);
        for (Simulator.Engine e : new Simulator.Engine[] {Simulator.Engine.AMPLITUDES,
                Simulator.Engine.TRAJECTORIES}) {
            Tally t = Simulator.seeded(2).withEngine(e).run(ipe, 200);
            assertEquals(200, t.count(0b101L), e + ": " + t);
        }
        // Without the correction only the first bit read (x3, from the phase 4 phi = 2.5) is
        // certain; x2 is read from 2 phi = 1.25 and x1 from phi itself. H, a phase e^{2 pi i a},
        // H gives 1 with probability sin^2(pi a) (Nielsen and Chuang 2010, §5.2.1).
        double[] raw = Simulator.seeded(1).distribution(phaseEstimation(5.0 / 8, false));
        double[] one = new double[3];
        for (int v = 0; v < 8; v++) {
            for (int c = 0; c < 3; c++) {
                one[c] += ((v >> c) & 1) * raw[v];
            }
        }
        assertEquals(Math.pow(Math.sin(5 * Math.PI / 8), 2), one[0], 1e-12);
        assertEquals(Math.pow(Math.sin(1.25 * Math.PI), 2), one[1], 1e-12);
        assertEquals(1, one[2], 1e-12);
    }

    /**
     * Repeat until success: {@code while (c0 == 0) { reset; h; measure }} with a counter. The
     * number of attempts is geometric (checked against Commons Statistics
     * {@link GeometricDistribution}, which counts failures before the first success), cut at
     * the loop's bound.
     */
    private static Circuit repeatUntilOne(int bound) {
        Circuit.Builder b = Circuit.builder(1, 5);
        Expression count = b.declare("attempts", Circuit.VariableType.UINT, 4,
                Expression.constant(0));
        b.whileLoop(Expression.of(Expression.Op.EQ, Expression.clbit(0), Expression.constant(0)),
                bound, body -> body.reset(0).h(0).measure(0, 0).assign("attempts",
                        Expression.of(Expression.Op.ADD, count, Expression.constant(1))));
        b.assignClbits(new int[] {1, 2, 3, 4}, count);
        return b.build();
    }

    private static void checkGeometric(double[] p, double success, int bound) {
        GeometricDistribution g = GeometricDistribution.of(success);
        double total = 0;
        for (int k = 1; k <= bound; k++) {
            int value = 1 | (k << 1);
            assertEquals(g.probability(k - 1), p[value], 1e-12, "attempts " + k);
            total += p[value];
        }
        // All attempts failed: the loop stopped at its bound with c0 = 0.
        assertEquals(Math.pow(1 - success, bound), p[bound << 1], 1e-12);
        assertEquals(1, total + p[bound << 1], 1e-12);
    }

    @Test
    void loopsCountAttemptsAsAGeometricDistribution() {
        int bound = 6;
        Circuit rus = repeatUntilOne(bound);
        checkGeometric(Simulator.seeded(3).distribution(rus), 0.5, bound);
        // Readout error changes what the loop sees: P(read 1) = (1 - P(0|1)) / 2 + P(1|0) / 2
        // (the law of total probability, common practice).
        NoiseModel readout = NoiseModel.builder().readoutError(0.1, 0.3).build();
        double[] noisy = Simulator.seeded(3).withNoise(readout).distribution(rus);
        checkGeometric(noisy, 0.5 * 0.7 + 0.5 * 0.1, bound);
        // Shots agree with the exact distribution on every engine that runs loops (chi-square
        // goodness of fit at 1e-4, Commons Statistics), the tableau included: the loop is
        // Clifford.
        double[] exact = Simulator.seeded(3).distribution(rus);
        for (Simulator.Engine e : new Simulator.Engine[] {Simulator.Engine.AMPLITUDES,
                Simulator.Engine.TABLEAU, Simulator.Engine.TRAJECTORIES}) {
            Tally t = Simulator.seeded(5).withEngine(e).run(rus, 4000);
            assertFits(exact, t, e.toString());
        }
        assertFits(noisy, Simulator.seeded(6).withNoise(readout).run(rus, 4000), "noisy");
    }

    private static void assertFits(double[] exact, Tally t, String what) {
        List<Double> expected = new ArrayList<>();
        List<Long> observed = new ArrayList<>();
        long seen = 0;
        for (int v = 0; v < exact.length; v++) {
            if (exact[v] > 0) {
                expected.add(exact[v]);
                observed.add(t.count((long) v));
                seen += t.count((long) v);
            }
        }
        assertEquals(t.shots(), seen, what + ": outcomes the exact distribution forbids");
        double[] e = expected.stream().mapToDouble(Double::doubleValue).toArray();
        long[] o = observed.stream().mapToLong(Long::longValue).toArray();
        double p = ChiSquareTest.withDefaults().test(e, o).getPValue();
        assertTrue(p > 1e-4, what + ": p = " + p + ", " + t);
    }

    @Test
    void teleportationWithConditionsOnExpressions() {
        // Teleportation (Bennett et al. 1993, Phys. Rev. Lett. 70, 1895): after the Bell
        // measurement, X if c1 and Z if c0 restore the state on qubit 2; P(1) = sin^2(t / 2).
        double theta = 1.1;
        Circuit.Builder b = Circuit.builder(3, 3).ry(0, theta).h(1).cnot(1, 2).cnot(0, 1).h(0)
                .measure(0, 0).measure(1, 1);
        b.ifThen(Expression.clbit(1), t -> t.x(2));
        b.ifThenElse(Expression.of(Expression.Op.EQ, Expression.clbit(0), Expression.constant(1)),
                t -> t.z(2), f -> f.delay(1e-6, 2));
        Circuit teleport = b.measure(2, 2).build();
        double[] p = Simulator.seeded(7).distribution(teleport);
        double one = 0;
        for (int v = 0b100; v < 8; v++) {
            one += p[v];
        }
        assertEquals(Math.pow(Math.sin(theta / 2), 2), one, 1e-12);
        // Each Bell outcome has probability 1/4 whatever the state (Bennett et al. 1993).
        for (int m = 0; m < 4; m++) {
            assertEquals(0.25, p[m] + p[m | 0b100], 1e-12);
        }
    }

    @Test
    void integerVariablesWrapModuloTheirWidth() {
        // An unsigned value that does not fit is reduced modulo 2^width (ISO/IEC 9899:2011,
        // §6.2.5 paragraph 9, for C's unsigned types; common practice for fixed-width
        // integers); a signed one wraps in two's complement.
        Circuit.Builder b = Circuit.builder(1, 6);
        Expression u = b.declare("u", Circuit.VariableType.UINT, 3, Expression.constant(7));
        b.assign("u", Expression.of(Expression.Op.ADD, u, Expression.constant(2)));
        Expression s = b.declare("s", Circuit.VariableType.INT, 3, Expression.constant(3));
        b.assign("s", Expression.of(Expression.Op.ADD, s, Expression.constant(1)));
        b.assignClbits(new int[] {0, 1, 2}, u);
        b.ifThen(Expression.of(Expression.Op.LT, s, Expression.constant(0)),
                t -> t.assignClbits(new int[] {3, 4, 5}, Expression.of(Expression.Op.NEG, s)));
        double[] p = Simulator.seeded(1).distribution(b.build());
        // u = 9 mod 8 = 1; s = 4 wraps to -4, so the block writes 4.
        assertEquals(1, p[1 | (4 << 3)], TOL);
    }

    @Test
    void delaysDoNothingToAnIdealState() {
        Circuit withDelay = Circuit.builder(2).h(0).delay(2e-6).cnot(0, 1).delay(1e-6, 1)
                .build();
        Circuit without = Circuit.builder(2).h(0).cnot(0, 1).build();
        assertTrue(withDelay.isGatesOnly());
        assertTrue(withDelay.measuresAtEnd());
        assertEquals(without.toOperator(), withDelay.toOperator());
        assertArrayEquals(StateVector.zero(2).apply(without).probabilities(),
                StateVector.zero(2).apply(withDelay).probabilities(), TOL);
        assertEquals(without.inverse().toOperator(), withDelay.inverse().toOperator());
        Circuit measured = Circuit.builder(2).h(0).delay(1e-6).cnot(0, 1).measure().build();
        for (Simulator.Engine e : Simulator.Engine.values()) {
            Tally t = Simulator.seeded(4).withEngine(e).run(measured, 100);
            assertEquals(100, t.count("00") + t.count("11"), e + ": " + t);
        }
    }

    @Test
    void refusedInputLeavesTheBuilderAsItWas() {
        Circuit.Builder b = Circuit.builder(1, 1).h(0);
        int before = b.build().size();
        assertThrows(IllegalArgumentException.class, () -> b.whileLoop(Expression.clbit(0), 0,
                body -> body.x(0)));
        assertThrows(IllegalArgumentException.class, () -> b.whileLoop(Expression.clbit(0),
                Circuit.Builder.MAX_ITERATIONS + 1, body -> body.x(0)));
        assertThrows(IllegalArgumentException.class, () -> b.ifThen(Expression.constant(0.5),
                t -> t.x(0)));
        assertThrows(IndexOutOfBoundsException.class, () -> b.ifThen(Expression.clbit(3),
                t -> t.x(0)));
        assertThrows(IllegalArgumentException.class, () -> b.delay(-1, 0));
        assertThrows(IllegalArgumentException.class, () -> b.delay(Double.NaN, 0));
        assertThrows(IllegalArgumentException.class, () -> b.assign("nothing",
                Expression.constant(1)));
        // A block that fails part-way adds nothing.
        assertThrows(IndexOutOfBoundsException.class, () -> b.ifThen(Expression.clbit(0),
                t -> t.x(0).x(5)));
        assertEquals(before, b.build().size());
    }

    @Test
    void expressionsAreBoundedInDepthAndSize() {
        Expression deep = Expression.clbit(0);
        for (int i = 1; i < Expression.MAX_DEPTH; i++) {
            deep = Expression.of(Expression.Op.NOT, deep);
        }
        Expression last = deep;
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Expression.of(Expression.Op.NOT, last));
        assertTrue(e.getMessage().contains(String.valueOf(Expression.MAX_DEPTH)), e.getMessage());
        // Sharing an operand doubles the work of each evaluation: refused past the size bound.
        Expression doubled = Expression.constant(1);
        for (int i = 0; i < 15; i++) {
            doubled = Expression.of(Expression.Op.ADD, doubled, doubled);
        }
        Expression big = doubled;
        e = assertThrows(IllegalArgumentException.class,
                () -> Expression.of(Expression.Op.ADD, big, big));
        assertTrue(e.getMessage().contains(String.valueOf(Expression.MAX_SIZE)), e.getMessage());
        assertEquals(1 << 15, big.evaluateInteger(null));
    }

    @Test
    void theTreeReadsBackAsItWasBuilt() {
        // The accessors return the parts each factory was given (their definitions), so a
        // writer can walk the tree: (c0 | c2 reg) + (-v) with v a declared variable.
        Circuit.Builder b = Circuit.builder(1, 3);
        Expression v = b.declare("v", Circuit.VariableType.INT, 8, null);
        Expression reg = Expression.clbits(2, 0);
        Expression neg = Expression.of(Expression.Op.NEG, v);
        Expression sum = Expression.of(Expression.Op.ADD, reg, neg);
        assertEquals(Expression.Op.ADD, sum.op());
        assertEquals(List.of(reg, neg), sum.operands());
        assertEquals(Expression.Op.NEG, neg.op());
        assertEquals(List.of(v), neg.operands());
        assertEquals(null, reg.op());
        assertEquals(List.of(), reg.operands());
        assertArrayEquals(new int[] {2, 0}, reg.registerBits());
        assertEquals(-1, reg.variableSlot());
        assertEquals(0, v.variableSlot());
        assertArrayEquals(new int[0], v.registerBits());
        assertEquals(-1, Expression.constant(3).variableSlot());
        assertArrayEquals(new int[0], sum.registerBits());
    }

    @Test
    void anAngleThatComesOutInfiniteStopsTheRunWithItsGate() {
        // 1.0 / c0 is +infinity when c0 reads 0 (IEEE 754 division by zero).
        Circuit c = Circuit.builder(1, 1).measure(0, 0)
                .gate(Gate.RX, new Expression[] {Expression.of(Expression.Op.DIV,
                        Expression.constant(1.0), Expression.clbit(0))}, 0)
                .build();
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Simulator.seeded(1).run(c, 3));
        assertTrue(e.getMessage().contains("rx") && e.getMessage().contains("Infinity"),
                e.getMessage());
    }

    @Test
    void delaysRelaxUnderAModelWithIdleTimes() {
        // T1 experiment: X, wait t, measure gives P(1) = exp(-t/T1); Ramsey experiment: H, wait
        // t, H gives P(1) = (1 - exp(-t/T2)) / 2 (Krantz et al. 2019, "A quantum engineer's
        // guide to superconducting qubits", Appl. Phys. Rev. 6, 021318, the T1 and Ramsey
        // measurements; from memory for the section).
        double t1 = 50e-6;
        double t2 = 30e-6;
        double wait = 20e-6;
        NoiseModel idle = NoiseModel.builder().relaxationWhileIdle(t1, t2).build();
        Circuit decay = Circuit.builder(1).x(0).delay(wait, 0).measure().build();
        Circuit ramsey = Circuit.builder(1).h(0).delay(wait, 0).h(0).measure().build();
        Simulator noisy = Simulator.seeded(8).withNoise(idle);
        assertEquals(Math.exp(-wait / t1), noisy.distribution(decay)[1], 1e-12);
        assertEquals((1 - Math.exp(-wait / t2)) / 2, noisy.distribution(ramsey)[1], 1e-12);
        // A delay inside a loop body relaxes on every pass (branch engine), and trajectories
        // agree with the exact distribution.
        Circuit.Builder b = Circuit.builder(1, 2).x(0);
        b.declare("n", Circuit.VariableType.UINT, 2, Expression.constant(0));
        b.whileLoop(Expression.of(Expression.Op.LT, b.variable("n"), Expression.constant(3)), 8,
                body -> body.delay(wait / 3, 0).assign("n", Expression.of(Expression.Op.ADD,
                        body.variable("n"), Expression.constant(1))));
        Circuit looped = b.measure(0, 0).build();
        double[] p = noisy.distribution(looped);
        assertEquals(Math.exp(-wait / t1), p[1], 1e-12);
        assertFits(p, noisy.withEngine(Simulator.Engine.TRAJECTORIES).run(looped, 3000),
                "trajectories");
        assertFits(noisy.distribution(ramsey), noisy.withEngine(Simulator.Engine.TRAJECTORIES)
                .run(ramsey, 3000), "ramsey trajectories");
        // Idle times alone make a model noisy; bad times are refused.
        assertTrue(!idle.isIdeal());
        assertThrows(IllegalArgumentException.class,
                () -> NoiseModel.builder().relaxationWhileIdle(10e-6, 30e-6));
        assertThrows(IllegalArgumentException.class,
                () -> NoiseModel.builder().relaxationWhileIdle(-1, 0, 1));
    }

    @Test
    void diagramsShowConditionsLoopsDelaysAndComputedAngles() {
        Circuit.Builder b = Circuit.builder(2, 2).h(0).measure(0, 0).delay(2e-6, 1);
        b.ifThenElse(Expression.clbit(0), t -> t.x(1), f -> f.z(1));
        b.whileLoop(Expression.of(Expression.Op.EQ, Expression.clbit(1), Expression.constant(0)),
                4, body -> body.h(1).measure(1, 1));
        b.gate(Gate.RX, new Expression[] {Expression.of(Expression.Op.MUL, Expression.clbit(0),
                Expression.constant(1.5))}, 0);
        String d = b.build().diagram();
        // Each part appears with its own label (the labels are ours, documented on diagram()).
        for (String part : new String[] {"wait(2us)", "X[if c[0]]", "Z[if not c[0]]",
            "H[while c[1] == 0]", "M>c1[while c[1] == 0]", "RX((c[0] * 1.5))"}) {
            assertTrue(d.contains(part), part + " in\n" + d);
        }
    }

    @Test
    void aCircuitTooWideToDrawIsSummarisedQuickly() {
        int n = Circuit.MAX_QUBITS;
        Circuit wide = Circuit.builder(n, 1).h(0).cnot(0, n - 1).measure(n - 1, 0).build();
        long start = System.nanoTime();
        String d = wide.diagram();
        assertTrue(System.nanoTime() - start < 5_000_000_000L, "took too long");
        assertTrue(d.startsWith("circuit of " + n + " qubit(s) and 3 instruction(s)")
                && d.contains("too large to draw"), d);
        // A moderate circuit is drawn in full: 2n - 1 rows (a wire per qubit, a gap between).
        Circuit.Builder mid = Circuit.builder(300);
        for (int q = 0; q < 299; q++) {
            mid.cnot(q, q + 1);
        }
        assertEquals(2 * 300 - 1, mid.build().diagram().lines().count());
    }
}
