package dev.qsim.spark.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.junit.jupiter.api.Test;

import dev.qsim.Circuit;
import dev.qsim.observable.Observable;
import dev.qsim.observable.TunableCircuit;

/** The tunable-circuit text of the tool and its observable terms. */
class TunableCircuitFileTest {
    private static void assertRefused(String part, String text) {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> TunableCircuitFile.read(text));
        assertTrue(e.getMessage().contains(part), e.getMessage());
    }

    @Test
    void aCircuitReadsGateForGateAsTheBuilderWouldBuildIt() {
        // Reference: the same circuit recorded with TunableCircuit.Builder and bound to the
        // same values gives an equal Circuit (gate for gate, angles exactly).
        TunableCircuit read = TunableCircuitFile.read("# comment\n\nqubits 3  # three\n"
                + "h 0\ncx 0 1\nrzz 1 2 2*gamma\nrx 0 -beta+pi/2\nry 2 3*pi/4\n"
                + "CPHASE 0 2 0.5*gamma-1e-1\nrz 1 -pi\ncz 0 2\n");
        TunableCircuit built = TunableCircuit.builder(3).h(0).cnot(0, 1)
                .rzz(1, 2, "gamma", 2, 0).rx(0, "beta", -1, Math.PI / 2).ry(2, 3 * Math.PI / 4)
                .cphase(0, 2, "gamma", 0.5, -0.1).rz(1, -Math.PI).cz(0, 2).build();
        assertEquals(List.of("gamma", "beta"), read.parameters());
        for (double[] v : new double[][] {{0.3, -1.2}, {2.0, 0.0}}) {
            Circuit a = read.bind(v);
            Circuit b = built.bind(v);
            assertEquals(b, a);
        }
    }

    @Test
    void badLinesAreRefusedWithTheirNumber() {
        assertRefused("empty", "# nothing\n");
        assertRefused("line 1: the first statement must be 'qubits N'", "h 0\n");
        assertRefused("N from 1 to 30", "qubits 31\n");
        assertRefused("line 2: unknown gate 'foo'", "qubits 2\nfoo 0\n");
        assertRefused("line 2: gate cnot takes 2 qubit(s) and 0 angle(s)", "qubits 2\ncx 0\n");
        assertRefused("qubit 'a'", "qubits 2\nh a\n");
        assertRefused("line 2", "qubits 2\nh 5\n");
        assertRefused("angle 'theta'", "qubits 1\nu 0 theta 0 0\n");
        assertRefused("angle '2**x'", "qubits 1\nrx 0 2**x\n");
        assertRefused("angle 'pi*'", "qubits 1\nrx 0 pi*\n");
        assertRefused("not a finite number", "qubits 1\nrx 0 pi/0\n");
        assertRefused("line 2: gate h takes 1 qubit(s) and 0 angle(s)", "qubits 1\nh 0 t\n");
        assertRefused("unknown gate 'unitary'", "qubits 1\nunitary 0\n");
    }

    @Test
    void observableTermsReadAsTheBuilderAddsThem() {
        Observable read = ObservableTerms.read(List.of("0.5 Z0 Z1", " -1.25 X2", "3 YIZ"));
        Observable built = Observable.builder().add(0.5, "Z0 Z1").add(-1.25, "X2")
                .add(3, "YIZ").build();
        assertEquals(built, read);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> ObservableTerms.read(List.of("Z0")));
        assertTrue(e.getMessage().contains("WEIGHT PAULI"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> ObservableTerms.read(List.of("x Z0")));
        assertTrue(e.getMessage().contains("'x'"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> ObservableTerms.read(List.of("1 Q0")));
        assertTrue(e.getMessage().contains("'1 Q0'"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> ObservableTerms.read(List.of()));
        assertTrue(e.getMessage().contains("0 were given"), e.getMessage());
    }
}
