package dev.qsim.spark;

/**
 * The seed of each item of a job (a point of a sweep, a circuit of a batch, a sequence of a
 * benchmark) from the job's seed and the item's index alone, so that an item gets the same
 * random numbers whichever partition, executor or retry computes it.
 *
 * <p>The index is first mixed through SplitMix64: {@code z = mix(index + γ)} with
 * {@code γ = 0x9E3779B97F4A7C15}, which is the first output of a SplitMix64 generator started
 * at state {@code index}; then the item's seed is {@code mix(jobSeed ^ z)}. {@code mix} is the
 * SplitMix64 output function (Steele, Lea and Flood 2014, "Fast splittable pseudorandom number
 * generators", OOPSLA '14, doi:10.1145/2714064.2660195; the finaliser constants of Stafford's
 * "Mix13"). Mixing first matters: neighbouring indices used directly as seeds,
 * {@code {seed, i}} and {@code {seed, i + 1}}, can give correlated first outputs with some
 * generators; after mixing, neighbouring indices give seeds that differ in about half their
 * bits. {@code mix} is a bijection of the 64-bit words, so distinct indices give distinct
 * {@code z} and, for one job seed, distinct item seeds.
 *
 * <p>The item's seed then goes where the single-machine API takes a seed
 * ({@code Simulator.seeded(seed)}, {@code Expectation.sampled(..., seed)}): a job's result for
 * an item equals that call's result with {@link #of(long, long)} as the seed. Stateless and
 * thread-safe.
 *
 * @since 0.1
 */
public final class ItemSeeds {
    /** The SplitMix64 increment, {@code 2^64 / φ} rounded to an odd number. */
    static final long GOLDEN_GAMMA = 0x9E3779B97F4A7C15L;

    private ItemSeeds() {
    }

    /**
     * Returns the seed of item {@code index} of a job with seed {@code jobSeed}.
     *
     * @param jobSeed the job's seed, any value
     * @param index the item's index, any value (jobs use 0, 1, 2, ...)
     * @return the item's seed
     */
    public static long of(long jobSeed, long index) {
        return mix(jobSeed ^ mix(index + GOLDEN_GAMMA));
    }

    /**
     * The SplitMix64 output function (Steele, Lea and Flood 2014), a bijection of the 64-bit
     * words.
     *
     * @param z the word
     * @return the mixed word
     */
    static long mix(long z) {
        long x = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        x = (x ^ (x >>> 27)) * 0x94D049BB133111EBL;
        return x ^ (x >>> 31);
    }
}
