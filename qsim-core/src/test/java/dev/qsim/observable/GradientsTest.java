package dev.qsim.observable;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import dev.qsim.StateVector;

class GradientsTest {

    /** A seeded random circuit using every parameterised gate, parameters shared (test data). */
    static TunableCircuit randomCircuit(int n, int gates, int params, long seed) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        TunableCircuit.Builder b = TunableCircuit.builder(n);
        for (int q = 0; q < n; q++) {
            b.h(q);
        }
        for (int g = 0; g < gates; g++) {
            String p = "p" + rng.nextInt(params);
            double scale = rng.nextBoolean() ? 1 : 2 * rng.nextDouble() - 1;
            double offset = rng.nextBoolean() ? 0 : rng.nextDouble();
            int a = rng.nextInt(n);
            int c = (a + 1 + rng.nextInt(n - 1)) % n;
            switch (rng.nextInt(8)) {
                case 0 -> b.rx(a, p, scale, offset);
                case 1 -> b.ry(a, p, scale, offset);
                case 2 -> b.rz(a, p, scale, offset);
                case 3 -> b.phase(a, p, scale, offset);
                case 4 -> b.cphase(a, c, p, scale, offset);
                case 5 -> b.rzz(a, c, p, scale, offset);
                case 6 -> b.cnot(a, c);
                default -> b.t(a).sqrtX(c);
            }
        }
        return b.build();
    }

    static double energy(TunableCircuit c, double[] v, Observable h) {
        return Expectation.of(h, StateVector.zero(c.qubits()).apply(c.bind(v)));
    }

    @ParameterizedTest
    @ValueSource(longs = {1, 2, 3, 4, 5, 6})
    void adjointParameterShiftAndFiniteDifferencesAgree(long seed) {
        int n = 3 + (int) (seed % 3);
        TunableCircuit c = randomCircuit(n, 30, 5, seed);
        Observable h = ExpectationTest.randomObservable(n, 6, seed + 50);
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed + 99);
        double[] v = new double[c.parameters().size()];
        for (int j = 0; j < v.length; j++) {
            v[j] = 6 * rng.nextDouble() - 3;
        }
        double[] adjoint = Gradients.adjoint(c, v, h);
        double[] shift = Gradients.parameterShift(c, v, h);
        // Central differences, error O(step²) ≈ 1e-10 · |E'''| (common practice).
        double step = 1e-5;
        double[] central = new double[v.length];
        for (int j = 0; j < v.length; j++) {
            double[] up = v.clone();
            double[] down = v.clone();
            up[j] += step;
            down[j] -= step;
            central[j] = (energy(c, up, h) - energy(c, down, h)) / (2 * step);
        }
        assertArrayEquals(shift, adjoint, 1e-10, "seed " + seed);
        assertArrayEquals(central, adjoint, 1e-7, "seed " + seed);
    }

    @Test
    void closedForms() {
        // ry(θ)|0> gives <Z> = cos θ, so d<Z>/dθ = -sin θ; H·phase(φ)·H|0> gives <Z> = cos φ
        // (Nielsen and Chuang 2010, §4.2, exact closed forms). Scale 3 multiplies by 3.
        Observable z = Observable.of(1, "Z0");
        TunableCircuit ry = TunableCircuit.builder(1).ry(0, "t", 3, 0).build();
        TunableCircuit ph = TunableCircuit.builder(1).h(0).phase(0, "t").h(0).build();
        for (double t = -2; t <= 2; t += 0.25) {
            assertEquals(-3 * Math.sin(3 * t), Gradients.adjoint(ry, new double[] {t}, z)[0],
                    1e-14);
            assertEquals(-3 * Math.sin(3 * t),
                    Gradients.parameterShift(ry, new double[] {t}, z)[0], 1e-14);
            assertEquals(-Math.sin(t), Gradients.adjoint(ph, new double[] {t}, z)[0], 1e-14);
            assertEquals(-Math.sin(t), Gradients.parameterShift(ph, new double[] {t}, z)[0], 1e-14);
        }
    }

    @Test
    void initialStateAndThreadCountsGiveTheSameBits() {
        TunableCircuit c = randomCircuit(15, 40, 6, 77);
        Observable h = ExpectationTest.randomObservable(15, 4, 78);
        double[] v = {0.1, 0.2, 0.3, 0.4, 0.5, 0.6};
        StateVector start = ExpectationTest.randomState(15, 79);
        double[] one = Gradients.adjoint(c, v, h, start.copy().setThreads(1));
        double[] two = Gradients.adjoint(c, v, h, start.copy().setThreads(2));
        assertArrayEquals(one, two, 0);
        // Not modified: the start state is still the same state.
        assertEquals(1, start.fidelity(ExpectationTest.randomState(15, 79)), 1e-12);
    }

    @Test
    void badInputIsRefused() {
        TunableCircuit c = TunableCircuit.builder(2).rx(0, "a").build();
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Gradients.adjoint(c, new double[] {0.1}, Observable.of(1, "Z4")));
        assertTrue(e.getMessage().contains("qubit 4"), e::getMessage);
        e = assertThrows(IllegalArgumentException.class,
                () -> Gradients.parameterShift(c, new double[0], Observable.of(1, "Z0")));
        assertTrue(e.getMessage().contains("[a]"), e::getMessage);
        e = assertThrows(IllegalArgumentException.class, () -> Gradients.adjoint(c,
                new double[] {0.1}, Observable.of(1, "Z0"), StateVector.zero(3)));
        assertTrue(e.getMessage().contains("3 qubit(s)"), e::getMessage);
    }
}
