package dev.qsim.spark;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.HashSet;
import java.util.Set;

import org.apache.commons.rng.core.source64.SplitMix64;
import org.junit.jupiter.api.Test;

/** The item seeds against the SplitMix64 of Apache Commons RNG. */
class ItemSeedsTest {
    @Test
    void theIndexIsMixedAsTheFirstOutputOfSplitMix64() {
        // Reference: Apache Commons RNG 1.6, SplitMix64 (Steele, Lea and Flood 2014): started
        // at state s, its first output is mix(s + 0x9E3779B97F4A7C15).
        for (long index : new long[] {0, 1, 2, 3, 1000, -1, Long.MAX_VALUE, Long.MIN_VALUE}) {
            long z = new SplitMix64(index).nextLong();
            assertEquals(ItemSeeds.mix(index + ItemSeeds.GOLDEN_GAMMA), z, "index " + index);
            for (long seed : new long[] {0, 7, -123456789L}) {
                assertEquals(ItemSeeds.mix(seed ^ z), ItemSeeds.of(seed, index));
            }
        }
    }

    @Test
    void seedsOfDistinctItemsAreDistinct() {
        // mix is a bijection of the 64-bit words (Steele, Lea and Flood 2014), so no two of
        // these may collide.
        Set<Long> seen = new HashSet<>();
        for (long i = 0; i < 200_000; i++) {
            assertEquals(true, seen.add(ItemSeeds.of(42, i)), "item " + i);
        }
    }

    @Test
    void neighbouringItemsGetSeedsThatDifferInHalfTheirBits() {
        // Strict avalanche criterion (Webster and Tavares 1985, CRYPTO '85): the bits that
        // differ between the seeds of items i and i + 1 are Binomial(64, 1/2), mean 32 and
        // standard deviation 4; the mean of 20,000 pairs has standard error 0.028.
        long sum = 0;
        int pairs = 20_000;
        for (long i = 0; i < pairs; i++) {
            sum += Long.bitCount(ItemSeeds.of(9, i) ^ ItemSeeds.of(9, i + 1));
        }
        assertEquals(32.0, sum / (double) pairs, 5 * 0.028);
    }
}
