package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Arrays;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * Grover search against its closed form. With M marked items among N = 2^n and sin θ = √(M/N),
 * the probability of measuring a marked item after k iterations from the uniform superposition is
 * sin²((2k+1)θ): Boyer, Brassard, Høyer, Tapp (1998), "Tight bounds on quantum searching",
 * Fortschritte der Physik 46, 493 (their Lemma 1; lemma number from memory); also Nielsen &amp;
 * Chuang (2010), <i>Quantum Computation and Quantum Information</i>, sec. 6.1.
 *
 * <p>Oracle: I − 2Σ_w |w><w|, one phase flip per marked w built as X on the zero bits of w, a
 * Z controlled by all other qubits, then X again. Diffusion: H^n X^n (C^{n−1}Z) X^n H^n
 * = −(2|s><s| − I); the global sign does not change probabilities (a global phase;
 * N&amp;C 2010 sec. 2.2.7, section from memory).
 */
class GroverReferenceTest {

    /** Tolerance on each success probability: a few hundred gates of ~1e-16 (common practice). */
    private static final double TOL = 1e-12;

    private static int[] range(int from, int to) {
        int[] r = new int[to - from];
        for (int i = from; i < to; i++) {
            r[i - from] = i;
        }
        return r;
    }

    /** Adds a phase flip of |w> on n qubits: X on zero bits, multi-controlled Z, X again. */
    private static void flip(Circuit.Builder b, int n, int w) {
        for (int q = 0; q < n; q++) {
            if ((w >> q & 1) == 0) {
                b.x(q);
            }
        }
        b.controlled(Gates.Z, range(1, n), 0);
        for (int q = 0; q < n; q++) {
            if ((w >> q & 1) == 0) {
                b.x(q);
            }
        }
    }

    private static Circuit iteration(int n, int[] marked) {
        Circuit.Builder b = Circuit.builder(n);
        for (int w : marked) {
            flip(b, n, w);
        }
        for (int q = 0; q < n; q++) {
            b.h(q);
        }
        flip(b, n, 0); // X^n (C^{n-1}Z) X^n = I − 2|0><0|
        for (int q = 0; q < n; q++) {
            b.h(q);
        }
        return b.build();
    }

    @ParameterizedTest
    @CsvSource({
        // n, marked items M, seed for choosing them
        "3, 1, 11", "3, 2, 12", "4, 1, 13", "4, 2, 14",
        "5, 1, 15", "5, 2, 16", "6, 1, 17", "6, 2, 18",
    })
    void successProbabilityIsSinSquaredOfOddMultiplesOfTheta(int n, int m, long seed) {
        int size = 1 << n;
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(seed);
        int[] marked = DenseReference.distinctQubits(size, m, rng); // m distinct items of 0..N-1
        Circuit.Builder uniform = Circuit.builder(n);
        for (int q = 0; q < n; q++) {
            uniform.h(q);
        }
        StateVector s = StateVector.zero(n).apply(uniform.build());
        Circuit step = iteration(n, marked);
        double theta = Math.asin(Math.sqrt((double) m / size));
        int best = (int) Math.floor(Math.PI / (4 * theta));
        for (int k = 0; k <= 2 * best + 1; k++) {
            double success = 0;
            for (int w : marked) {
                success += s.probability(w);
            }
            // Boyer, Brassard, Høyer, Tapp (1998): P(k) = sin²((2k+1)θ), sin θ = √(M/N).
            double expected = Math.pow(Math.sin((2 * k + 1) * theta), 2);
            assertEquals(expected, success, TOL, "n = " + n + ", marked "
                    + Arrays.toString(marked) + ", after " + k + " iterations");
            s.apply(step);
        }
    }
}
