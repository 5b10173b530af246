package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SortedMap;
import java.util.function.Consumer;

import org.apache.commons.numbers.complex.Complex;
import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

/**
 * The public API contract of the design document, written out call by call with the declared
 * types, so that a change of name or signature fails to compile. Values are checked against
 * closed forms: the circuit below is a product of textbook gates (Nielsen and Chuang 2010,
 * §4.2-4.3), and its probabilities sum to 1 (common practice).
 */
class ContractTest {
    @Test
    void theContractCompilesAndBehavesAsWritten() {
        Circuit c = Circuit.builder(3)                 // qubits; clbits default to the same count
                .h(0).cnot(0, 1).toffoli(0, 1, 2)
                .rz(2, Math.PI / 8).cphase(0, 2, 0.3)
                .apply(Gates.SQRT_X, 1)                 // any Operator on the given qubits
                .measure()                              // every qubit k into clbit k
                .build();
        int qubits = c.qubits();
        int clbits = c.clbits();
        int size = c.size();
        int depth = c.depth();
        String diagram = c.diagram();
        assertEquals(3, qubits);
        assertEquals(3, clbits);
        assertEquals(9, size);
        assertTrue(depth >= 5 && !diagram.isEmpty());

        Consumer<Circuit.Builder> then = b -> b.x(1);
        Circuit.Builder builder = Circuit.builder(2, 2);
        Circuit all = builder.h(0).x(1).y(0).z(1).s(0).sDagger(1).t(0).tDagger(1).sqrtX(0)
                .rx(0, 0.1).ry(1, 0.2).rz(0, 0.3).phase(1, 0.4)
                .cnot(0, 1).cz(0, 1).cphase(0, 1, 0.5).swap(0, 1).rzz(0, 1, 0.6)
                .apply(Gates.H, 0).controlled(Gates.X, new int[] {0}, 1)
                .measure(0, 0).reset(0).ifBit(0, 1, then).append(Circuit.builder(1).h(0).build())
                .build();
        assertEquals(24, all.size());
        Circuit unitary = Circuit.builder(3).toffoli(0, 1, 2).fredkin(0, 1, 2).h(2).build();
        Circuit inverse = unitary.inverse();
        Operator whole = unitary.toOperator();
        assertTrue(whole.times(inverse.toOperator()).isUnitary(1e-12));

        Operator x = Operator.of(new Complex[][] {{Complex.ZERO, Complex.ONE},
            {Complex.ONE, Complex.ZERO}});
        Operator id = Operator.identity(1);
        int opQubits = x.tensor(id).qubits();
        Complex entry = x.times(x).get(0, 0);
        Operator dag = x.dagger();
        boolean unitaryX = dag.isUnitary(1e-9);
        assertEquals(2, opQubits);
        assertEquals(Complex.ONE, entry);
        assertTrue(unitaryX);
        Operator[] constants = {Gates.I, Gates.X, Gates.Y, Gates.Z, Gates.H, Gates.S,
            Gates.S_DAGGER, Gates.T, Gates.T_DAGGER, Gates.SQRT_X, Gates.CNOT, Gates.CZ,
            Gates.SWAP, Gates.TOFFOLI, Gates.rx(1), Gates.ry(1), Gates.rz(1), Gates.phase(1),
            Gates.cphase(1), Gates.rzz(1)};
        for (Operator g : constants) {
            assertTrue(g.isUnitary(1e-9));
        }

        StateVector z = StateVector.zero(2);
        StateVector b = StateVector.basis(2, 3L);
        StateVector o = StateVector.of(Complex.ONE, Complex.ZERO);
        int n = z.qubits();
        long dim = z.dimension();
        Complex amp = b.amplitude(3L);
        double p = b.probability(3L);
        double[] probs = z.probabilities();
        double[] marg = z.marginal(1);
        double norm = z.norm();
        Complex inner = z.inner(b);
        double fid = z.fidelity(b);
        StateVector prod = o.tensor(z);
        StateVector copy = z.copy();
        StateVector same = copy.apply(Circuit.builder(2).h(0).build()).apply(Gates.X, 1);
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(3L);
        int bit = same.copy().measure(0, rng);
        Tally sampled = same.sample(100, rng, 0);
        assertEquals(2, n);
        assertEquals(4L, dim);
        assertEquals(Complex.ONE, amp);
        assertEquals(1.0, p);
        assertEquals(1.0, probs[0] + probs[1] + probs[2] + probs[3]);
        assertEquals(1.0, marg[0]);
        assertEquals(1.0, norm);
        assertEquals(Complex.ZERO, inner);
        assertEquals(0.0, fid);
        assertEquals(3, prod.qubits());
        assertTrue(same == copy && (bit == 0 || bit == 1));
        assertEquals(100L, sampled.shots());

        Simulator sim = Simulator.seeded(42L).withThreads(2);
        Tally t = sim.run(c, 1000);
        StateVector after = sim.stateAfter(c);
        long shots = t.shots();
        int width = t.width();
        long byBits = t.count("000");
        long byValue = t.count(0L);
        double freq = t.probability("000");
        SortedMap<String, Long> outcomes = t.outcomes();
        String csv = t.toCsv();
        assertEquals(1000L, shots);
        assertEquals(3, width);
        assertEquals(byBits, byValue);
        assertEquals(byBits / 1000.0, freq);
        assertEquals(1000L, outcomes.values().stream().mapToLong(Long::longValue).sum());
        assertTrue(csv.startsWith("bits,count\n"));
        assertEquals(1.0, after.norm(), 1e-12);
    }
}
