package dev.qsim.examples;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

class MaxCutQaoaTest {

    /** Brute-force maximum cut by exhaustive enumeration of all 2^n splits (common practice). */
    private static int bruteForce(int nodes, int[][] edges) {
        int best = 0;
        for (int s = 0; s < (1 << nodes); s++) {
            int c = 0;
            for (int[] e : edges) {
                if (((s >> e[0]) & 1) != ((s >> e[1]) & 1)) {
                    c++;
                }
            }
            best = Math.max(best, c);
        }
        return best;
    }

    @ParameterizedTest
    @ValueSource(ints = {1, 2})
    void bestSampledCutIsTheBruteForceMaximum(int layers) {
        Capture out = new Capture();
        MaxCutQaoa.Result r = MaxCutQaoa.run(out.stream(), layers, 1_411L, 1_000);
        int max = bruteForce(MaxCutQaoa.NODES, MaxCutQaoa.EDGES);
        assertEquals(max, r.maxCut());
        assertEquals(max, r.bestSampledCut(), out::text);
        // The graph is 3-regular; for such graphs p = 1 QAOA at its optimal angles reaches
        // <C> >= 0.6924 · maxcut (Farhi, Goldstone and Gutmann 2014, arXiv:1411.4028, §4), and
        // p = 2 can only do better.
        assertTrue(r.expectedCut() >= 0.6924 * max, out::text);
        assertTrue(out.text().contains("brute-force maximum cut      " + max), out::text);
    }

    @Test
    void badLayersAreRefused() {
        Capture out = new Capture();
        UsageException e = assertThrows(UsageException.class,
                () -> MaxCutQaoa.fromArgs(new String[] {"0"}, out.stream()));
        assertTrue(e.getMessage().contains("0"), e::getMessage);
        e = assertThrows(UsageException.class,
                () -> MaxCutQaoa.fromArgs(new String[] {"two"}, out.stream()));
        assertTrue(e.getMessage().contains("'two'"), e::getMessage);
    }
}
