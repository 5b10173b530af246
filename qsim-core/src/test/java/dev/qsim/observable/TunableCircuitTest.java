package dev.qsim.observable;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.HashMap;
import java.util.List;
import java.util.Map;

import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.Gates;

class TunableCircuitTest {

    private static TunableCircuit sample() {
        return TunableCircuit.builder(3).h(0).rx(0, "a").ry(1, "b", 2, 0.5).cnot(0, 1)
                .rz(2, "a", -1, 0).phase(1, "c").cphase(0, 2, "b").rzz(1, 2, "c", 0.5, -0.25)
                .rx(2, 0.3).apply(Gates.SQRT_X, 1).toffoli(0, 1, 2).build();
    }

    @Test
    void bindingGivesThePlainCircuitGateForGate() {
        // Expected: the same gates written with dev.qsim's Circuit.Builder, angle = scale·θ +
        // offset.
        double a = 0.7;
        double b = -1.1;
        double c = 2.5;
        Circuit expected = Circuit.builder(3, 0).h(0).rx(0, a).ry(1, 2 * b + 0.5).cnot(0, 1)
                .rz(2, -a).phase(1, c).cphase(0, 2, b).rzz(1, 2, 0.5 * c - 0.25).rx(2, 0.3)
                .apply(Gates.SQRT_X, 1).toffoli(0, 1, 2).build();
        TunableCircuit t = sample();
        assertEquals(List.of("a", "b", "c"), t.parameters());
        assertEquals(11, t.size());
        assertEquals(expected, t.bind(a, b, c));
        Map<String, Double> byName = new HashMap<>();
        byName.put("c", c);
        byName.put("a", a);
        byName.put("b", b);
        assertEquals(expected, t.bind(byName));
    }

    @Test
    void badBindingsAreRefused() {
        TunableCircuit t = sample();
        Map<String, Double> unknown = new HashMap<>(Map.of("a", 1.0, "b", 2.0, "c", 3.0));
        unknown.put("gamma", 4.0);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> t.bind(unknown));
        assertTrue(e.getMessage().contains("'gamma'") && e.getMessage().contains("[a, b, c]"),
                e::getMessage);
        e = assertThrows(IllegalArgumentException.class, () -> t.bind(Map.of("a", 1.0, "b", 2.0)));
        assertTrue(e.getMessage().contains("'c'") && e.getMessage().contains("no value"),
                e::getMessage);
        e = assertThrows(IllegalArgumentException.class, () -> t.bind(1.0, 2.0));
        assertTrue(e.getMessage().contains("2 value(s)"), e::getMessage);
        e = assertThrows(IllegalArgumentException.class, () -> t.bind(1.0, Double.NaN, 3.0));
        assertTrue(e.getMessage().contains("'b'") && e.getMessage().contains("NaN"), e::getMessage);
    }

    @Test
    void badGatesAreRefusedAndLeaveTheBuilderUnchanged() {
        TunableCircuit.Builder b = TunableCircuit.builder(2).rx(0, "a");
        IndexOutOfBoundsException o = assertThrows(IndexOutOfBoundsException.class,
                () -> b.ry(5, "b"));
        assertTrue(o.getMessage().contains("qubit 5"), o::getMessage);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> b.rz(0, "my angle"));
        assertTrue(e.getMessage().contains("'my angle'"), e::getMessage);
        e = assertThrows(IllegalArgumentException.class, () -> b.rzz(0, 1, "c", Double.NaN, 0));
        assertTrue(e.getMessage().contains("NaN"), e::getMessage);
        e = assertThrows(IllegalArgumentException.class, () -> b.cphase(1, 1, "c"));
        assertTrue(e.getMessage().contains("qubit 1"), e::getMessage);
        TunableCircuit t = b.build();
        assertEquals(List.of("a"), t.parameters());
        assertEquals(1, t.size());
    }
}
