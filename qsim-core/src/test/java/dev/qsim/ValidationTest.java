package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.function.Executable;

/**
 * Bad input gets a clear exception naming the bad value and what is allowed, and leaves every
 * object as it was (the validation rules of the API contract; common practice).
 */
class ValidationTest {
    private static <T extends Throwable> T fails(Class<T> type, Executable call, String... parts) {
        T e = assertThrows(type, call);
        for (String p : parts) {
            assertTrue(e.getMessage().contains(p), () -> "message '" + e.getMessage()
                    + "' should contain '" + p + "'");
        }
        return e;
    }

    @Test
    void scaledRefusesNonFiniteFactorsAndProducts() {
        fails(IllegalArgumentException.class, () -> Gates.X.scaled(Complex.ofCartesian(
                Double.NaN, 0)), "factor must be finite", "NaN");
        fails(IllegalArgumentException.class, () -> Gates.X.scaled(Complex.ofCartesian(0,
                Double.POSITIVE_INFINITY)), "Infinity");
        Operator big = Operator.of(new Complex[][] {{Complex.ONE, Complex.ZERO},
            {Complex.ZERO, Complex.ofCartesian(1e300, 0)}});
        // 1e300 * 1e10 overflows a double (IEEE 754 binary64, largest finite about 1.8e308).
        fails(IllegalArgumentException.class, () -> big.scaled(Complex.ofCartesian(1e10, 0)),
                "entry (1, 1)", "(1.0E300,0.0)", "not finite");
        assertEquals(1e300, big.get(1, 1).getReal(), 0.0, "the operator is unchanged");
        assertThrows(NullPointerException.class, () -> Gates.X.scaled(null));
    }

    @Test
    void builderRefusesBadQubitsAndKeepsItsInstructions() {
        Circuit.Builder b = Circuit.builder(4).h(0);
        fails(IndexOutOfBoundsException.class, () -> b.h(5), "qubit 5", "[0, 3]");
        fails(IndexOutOfBoundsException.class, () -> b.x(-1), "qubit -1");
        fails(IllegalArgumentException.class, () -> b.cnot(2, 2), "qubit 2 appears twice");
        fails(IllegalArgumentException.class, () -> b.toffoli(0, 1, 0), "appears twice");
        fails(IllegalArgumentException.class, () -> b.rz(1, Double.NaN), "finite", "NaN");
        fails(IllegalArgumentException.class, () -> b.rx(1, Double.POSITIVE_INFINITY),
                "Infinity");
        fails(IllegalArgumentException.class, () -> b.cphase(0, 1, Double.NaN), "NaN");
        fails(IndexOutOfBoundsException.class, () -> b.measure(0, 4), "clbit 4", "[0, 3]");
        fails(IllegalArgumentException.class, () -> b.ifBit(0, 2, x -> x.x(0)), "0 or 1", "2");
        fails(IndexOutOfBoundsException.class, () -> b.ifBit(0, 1, x -> x.x(9)), "qubit 9");
        assertEquals(1, b.build().size(), "refused calls must record nothing");
    }

    @Test
    void builderRefusesNonUnitaryAndWrongSizedOperators() {
        Circuit.Builder b = Circuit.builder(3);
        Operator notUnitary = Operator.of(new Complex[][] {
            {Complex.ONE, Complex.ONE}, {Complex.ZERO, Complex.ONE}});
        fails(IllegalArgumentException.class, () -> b.apply(notUnitary, 0), "not unitary");
        fails(IllegalArgumentException.class, () -> b.apply(Gates.CNOT, 0),
                "acts on 2 qubit(s) but 1");
        fails(IllegalArgumentException.class, () -> b.controlled(Gates.X, new int[] {1}, 1),
                "appears twice");
        assertEquals(0, b.build().size());
    }

    @Test
    void measuringEveryQubitNeedsEnoughClbits() {
        Circuit.Builder b = Circuit.builder(3, 2);
        fails(IllegalArgumentException.class, b::measure, "2 clbit(s) for 3 qubit(s)");
        fails(IllegalArgumentException.class, () -> Circuit.builder(0), "qubit count", "0");
        fails(IllegalArgumentException.class, () -> Circuit.builder(2, -1), "clbit count");
    }

    @Test
    void operatorOfRefusesBadMatrices() {
        fails(IllegalArgumentException.class, () -> Operator.of(new Complex[3][3]),
                "2^k rows", "3 row(s)");
        fails(IllegalArgumentException.class, () -> Operator.of(new Complex[][] {
            {Complex.ONE, Complex.ZERO}, {Complex.ZERO}}), "square", "row 1");
        fails(IllegalArgumentException.class, () -> Operator.of(new Complex[][] {
            {Complex.ofCartesian(Double.NaN, 0), Complex.ZERO}, {Complex.ZERO, Complex.ONE}}),
                "entry (0, 0)", "finite");
        // A Hermitian, non-unitary observable is a valid operator (the contract).
        Operator obs = Operator.of(new Complex[][] {
            {Complex.ofCartesian(2, 0), Complex.ZERO}, {Complex.ZERO, Complex.ZERO}});
        assertTrue(obs.isHermitian(0) && !obs.isUnitary(1e-9));
        fails(IllegalArgumentException.class, () -> Gates.rz(Double.NaN), "NaN");
        fails(IllegalArgumentException.class, () -> Gates.X.times(Gates.CNOT), "sizes must match");
    }

    @Test
    void stateVectorRefusesBadInputAndStaysUnchanged() {
        StateVector s = StateVector.zero(3).apply(Gates.H, 0);
        Complex[] before = s.amplitudes();
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(1L);
        fails(IndexOutOfBoundsException.class, () -> s.apply(Gates.H, 3), "qubit 3", "[0, 2]");
        fails(IllegalArgumentException.class, () -> s.apply(Gates.CNOT, 1, 1), "twice");
        fails(IllegalArgumentException.class, () -> s.apply(Gates.CNOT, 1), "acts on 2");
        Operator notUnitary = Operator.of(new Complex[][] {
            {Complex.ONE, Complex.ZERO}, {Complex.ZERO, Complex.ofCartesian(2, 0)}});
        fails(IllegalArgumentException.class, () -> s.apply(notUnitary, 0), "not unitary");
        fails(IllegalArgumentException.class, () -> s.sample(0, rng), "shots", "0");
        fails(IllegalArgumentException.class, () -> s.sample(-5, rng), "-5");
        fails(IndexOutOfBoundsException.class, () -> s.measure(7, rng), "qubit 7");
        fails(IllegalArgumentException.class,
                () -> s.apply(Circuit.builder(3).h(0).measure().build()), "Simulator");
        fails(IllegalArgumentException.class, () -> s.apply(Circuit.builder(2).h(0).build()),
                "2 qubit(s)", "3");
        fails(IndexOutOfBoundsException.class, () -> s.amplitude(8), "basis index 8");
        fails(IllegalArgumentException.class, () -> s.inner(StateVector.zero(2)), "differ");
        fails(IllegalArgumentException.class, () -> s.marginal(0, 0), "twice");
        assertEquals(java.util.Arrays.asList(before), java.util.Arrays.asList(s.amplitudes()),
                "refused calls must leave the state as it was");
    }

    @Test
    void stateVectorOfRefusesUnnormalisedAndMalformedAmplitudes() {
        fails(IllegalArgumentException.class,
                () -> StateVector.of(Complex.ONE, Complex.ONE), "normalised", "2.0");
        fails(IllegalArgumentException.class,
                () -> StateVector.of(Complex.ONE, Complex.ZERO, Complex.ZERO), "2^n", "3");
        fails(IllegalArgumentException.class,
                () -> StateVector.of(Complex.ofCartesian(Double.NaN, 0), Complex.ZERO),
                "amplitude 0", "finite");
        fails(IndexOutOfBoundsException.class, () -> StateVector.basis(2, 4), "basis index 4");
        fails(IllegalArgumentException.class, () -> StateVector.zero(0), "qubit count");
    }

    @Test
    void stateTooLargeForTheHeapIsRefusedWithBytesAndXmx() {
        // 36 qubits need 1 TiB: more than any test heap. The message names bytes and -Xmx.
        IllegalStateException e = fails(IllegalStateException.class, () -> StateVector.zero(36),
                "36-qubit state", "1099511627776 bytes", "maximum heap", "-Xmx");
        assertTrue(e.getMessage().contains("1024.0 GiB"), e.getMessage());
        // With the state vector forced; left to choose, the simulator runs a non-Clifford
        // circuit that large on the matrix product state, and a Clifford one on the stabilizer
        // engine.
        fails(IllegalStateException.class, () -> Simulator.seeded(1)
                .withEngine(Simulator.Engine.AMPLITUDES)
                .run(Circuit.builder(36).t(0).build(), 10), "-Xmx");
        fails(IllegalStateException.class, () -> Simulator.seeded(1)
                .withEngine(Simulator.Engine.AMPLITUDES)
                .run(Circuit.builder(36).h(0).build(), 10), "-Xmx");
    }

    @Test
    void singlePrecisionStatesAreRefusedOnTheirOwnSize() {
        // 36 qubits in single precision need 8 bytes an amplitude: 512 GiB (common practice:
        // a float is 4 bytes, IEEE 754-2019 binary32).
        IllegalStateException e = fails(IllegalStateException.class,
                () -> StateVector.zero(36, Precision.SINGLE), "36-qubit state in single precision",
                "549755813888 bytes", "-Xmx");
        assertTrue(e.getMessage().contains("512.0 GiB"), e.getMessage());
        fails(IllegalStateException.class, () -> Simulator.seeded(1)
                .withEngine(Simulator.Engine.AMPLITUDES).withPrecision(Precision.SINGLE)
                .run(Circuit.builder(36).t(0).build(), 10), "-Xmx");
        fails(IndexOutOfBoundsException.class, () -> StateVector.basis(3, 8, Precision.SINGLE),
                "8", "[0, 7]");
        fails(IllegalArgumentException.class, () -> StateVector.zero(41, Precision.SINGLE),
                "41");
        fails(NullPointerException.class, () -> StateVector.zero(2).toPrecision(null),
                "precision");
        // A refused conversion leaves the state as it was.
        StateVector s = StateVector.zero(2, Precision.SINGLE).apply(Circuit.builder(2).h(1)
                .build());
        String before = s.toString();
        fails(NullPointerException.class, () -> s.toPrecision(null), "precision");
        assertEquals(before, s.toString());
        assertEquals(Precision.SINGLE, s.precision());
    }

    @Test
    void simulatorAndTallyRefuseBadInput() {
        Circuit c = Circuit.builder(2).h(0).measure().build();
        fails(IllegalArgumentException.class, () -> Simulator.seeded(1).run(c, 0), "shots");
        fails(IllegalArgumentException.class, () -> Simulator.seeded(1).withThreads(0),
                "thread count", "0");
        Tally t = Simulator.seeded(1).run(c, 10);
        fails(IllegalArgumentException.class, () -> t.count("0"), "width is 2");
        fails(IllegalArgumentException.class, () -> t.count("0a"), "'a' at position 1");
        fails(IllegalArgumentException.class, () -> t.count(4L), "out of range [0, 3]");
        fails(IllegalArgumentException.class,
                () -> Tally.of(2, java.util.Map.of("01", -1L)), "at least 0", "-1");
        fails(IllegalArgumentException.class, () -> Tally.of(2, java.util.Map.of("011", 1L)),
                "3 character(s)");
        fails(IllegalArgumentException.class, () -> c.inverse(), "gates only", "measure");
    }
}
