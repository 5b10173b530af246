package dev.qsim.bench.observable;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

import dev.qsim.observable.Gradients;
import dev.qsim.observable.Observable;
import dev.qsim.observable.TunableCircuit;

class GradientBenchmarkTest {

    @Test
    void workloadHasTheAdvertisedShape() {
        TunableCircuit c = GradientBenchmark.circuit(20, 200);
        assertEquals(200, c.parameters().size());
        // 200 rotations and 10 ladders of 19 CNOTs.
        assertEquals(200 + 10 * 19, c.size());
        Observable h = GradientBenchmark.observable(20, 50, 1);
        assertEquals(50, h.size());
        for (int k = 0; k < h.size(); k++) {
            int w = h.product(k).weight();
            assertTrue(w >= 2 && w <= 4, "weight " + w);
        }
    }

    @Test
    void adjointAgreesWithParameterShiftOnASmallWorkload() {
        // Two exact methods (Jones and Gacon 2020; Mitarai et al. 2018) must give one gradient.
        TunableCircuit c = GradientBenchmark.circuit(6, 24);
        double[] v = GradientBenchmark.values(24, 3);
        Observable h = GradientBenchmark.observable(6, 10, 4);
        assertArrayEquals(Gradients.parameterShift(c, v, h), Gradients.adjoint(c, v, h), 1e-10);
    }
}
