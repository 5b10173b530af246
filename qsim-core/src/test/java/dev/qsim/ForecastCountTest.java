package dev.qsim;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;
import org.junit.jupiter.api.Test;

import dev.qsim.internal.EngineWork;
import dev.qsim.internal.HeapLayout;
import dev.qsim.kernel.Frame;
import dev.qsim.kernel.GateOp;
import dev.qsim.kernel.Workload;
import dev.qsim.noise.Channel;
import dev.qsim.noise.NoiseModel;

/**
 * The forecast's counting, exactly, on small circuits worked by hand. Passes follow the rules
 * the engines document: a state-vector gate streams the state once unless it is an X or a
 * single-qubit phase (kept in the lazy frame, {@link Frame}) or it joins a cache-blocked group
 * of gates below qubit {@value Frame#CACHE_LOG} (one stream for the group); a controlled gate
 * touches the half of the amplitudes where its control is 1; a density-matrix gate is
 * {@code U} on the row qubits then {@code conj(U)} on the column qubits (two passes), a channel
 * one pass of its superoperator (Horn and Johnson 1991, Topics in Matrix Analysis, Lemma
 * 4.3.1). Sizes: {@code 2^n} amplitudes of 16 bytes in double precision, 8 in single, a density
 * matrix {@code 4^n} entries of 16 bytes (common practice; Nielsen and Chuang 2010, §2.4).
 */
class ForecastCountTest {
    private static final int N = 16; // above the cache block of 2^14 amplitudes

    private static Workload only(EngineWork e) {
        assertEquals(1, e.parts().size(), "parts");
        return e.parts().get(0).work();
    }

    private static EngineWork sv(Circuit c, int shots, boolean fuse) {
        return AmplitudeCost.work(c, shots, Precision.DOUBLE, fuse, 2);
    }

    @Test
    void oneHadamardOnATopQubitIsOnePassThenOneSamplingPass() {
        // h on qubit 15 >= 14 cannot be blocked: one dense pass (H is real: the loops with half
        // the arithmetic); then one sampling pass.
        Workload w = only(sv(Circuit.builder(N).h(15).measure().build(), 100, false));
        assertEquals(1, w.passes(Workload.DENSE1_HALF), "dense passes");
        assertEquals(1, w.streamed(Workload.DENSE1_HALF), "whole state touched once");
        assertEquals(1, w.passes(Workload.SAMPLE), "sampling passes");
        assertEquals(2, w.totalPasses(), "all passes");
    }

    @Test
    void gatesBelowTheCacheBlockShareOneStream() {
        // h on 0, 1, 2: all below 14, one blocked group: one stream, three gates in cache.
        Workload w = only(sv(Circuit.builder(N).h(0).h(1).h(2).measure().build(), 10, false));
        assertEquals(1, w.passes(Workload.BLOCK_STREAM), "group streams");
        assertEquals(0, w.passes(Workload.DENSE1_HALF), "no lone dense pass");
        assertEquals(3, w.cached(Workload.DENSE1_HALF), "gates done in cache");
        assertEquals(2, w.totalPasses(), "group and sampling");
    }

    @Test
    void frameGatesCostNoPassUntilSettled() {
        // x(3), z(5), t(7) go to the frame; before sampling the frame settles: one pass for
        // the phases and one permutation pass moving qubit 3's flip.
        Workload w = only(sv(Circuit.builder(N).x(3).z(5).t(7).measure().build(), 10, false));
        assertEquals(1, w.passes(Workload.PHASES), "phase pass");
        assertEquals(1, w.passes(Workload.PERMUTATION), "flip moved");
        assertEquals(0, w.passes(Workload.DENSE1), "no dense pass");
        assertEquals(3, w.totalPasses(), "phases, flip and sampling");
    }

    @Test
    void aControlledGateTouchesHalfTheState() {
        // cnot(0, 15): X on 15 where qubit 0 is 1: one permutation pass over half the state.
        Workload w = only(sv(Circuit.builder(N).cnot(0, 15).measure().build(), 10, false));
        assertEquals(1, w.passes(Workload.PERMUTATION), "passes");
        assertEquals(0.5, w.streamed(Workload.PERMUTATION), "half the amplitudes");
    }

    @Test
    void fusionMergesARunOnOneQubitIntoOnePass() {
        // h, ry, h on qubit 15: by Fusion's cost table a merged 1-qubit block costs 1 against
        // 3 for the parts, so the run becomes one dense pass. Unfused, the three gates on a
        // qubit above the cache block go into one window: one stream pass, three dense units
        // done in cache.
        Circuit c = Circuit.builder(N).h(15).ry(15, 0.3).h(15).measure().build();
        Workload fused = only(sv(c, 10, true));
        assertEquals(1, fused.passes(Workload.DENSE1), "one fused pass");
        assertEquals(2, fused.totalPasses(), "and the sampling pass");
        Workload plain = only(sv(c, 10, false));
        assertEquals(0, plain.passes(Workload.DENSE1_HALF), "unfused: no lone dense pass");
        assertEquals(1, plain.passes(Workload.WINDOW_STREAM_DOUBLE), "unfused: one window");
        assertEquals(3, plain.cached(Workload.DENSE1_HALF), "unfused: three gates in cache");
    }

    @Test
    void aWindowReadInShortRunsCountsAsTheShortRunKind() {
        // A window holds 2^14 amplitudes: the low bits [0, l) and the group's targets at or
        // above l, with l the largest that fits (Windows.lowBits). Unfused h on 13, 14, 15:
        // l = 11 (11 + 3 targets = 14), runs of 2^11, a sixth of the way from runs of 2^12 to
        // runs of 2^6: 5/6 of a long-run pass and 1/6 of a short-run one. h on 8 to 15: l = 6
        // (6 + 8 = 14), one short-run pass. h on 14 and 15: l = 12, one long-run pass.
        Circuit three = Circuit.builder(N).h(13).h(14).h(15).measure().build();
        Workload w = only(sv(three, 10, false));
        assertEquals(5.0 / 6, w.passes(Workload.WINDOW_STREAM_DOUBLE), 1e-12, "long runs");
        assertEquals(1.0 / 6, w.passes(Workload.WINDOW_SHORT_DOUBLE), 1e-12, "short runs");
        assertEquals(5.0 / 6, w.streamed(Workload.WINDOW_STREAM_DOUBLE), 1e-12, "long units");
        assertEquals(1.0 / 6, w.streamed(Workload.WINDOW_SHORT_DOUBLE), 1e-12, "short units");
        assertEquals(2, w.totalPasses(), 1e-12, "one window and the sampling pass");
        Circuit.Builder b = Circuit.builder(N);
        for (int q = 8; q < N; q++) {
            b.h(q);
        }
        Workload eight = only(sv(b.measure().build(), 10, false));
        assertEquals(0, eight.passes(Workload.WINDOW_STREAM_DOUBLE), "no long-run pass");
        assertEquals(1, eight.passes(Workload.WINDOW_SHORT_DOUBLE), "one short-run pass");
        Workload two = only(sv(Circuit.builder(N).h(14).h(15).measure().build(), 10, false));
        assertEquals(1, two.passes(Workload.WINDOW_STREAM_DOUBLE), "one long-run pass");
        assertEquals(0, two.passes(Workload.WINDOW_SHORT_DOUBLE), "no short-run pass");
        // Single precision: every group is windowed, at the single-precision kinds.
        Workload single = only(AmplitudeCost.work(three, 10, Precision.SINGLE, false, 2));
        assertEquals(5.0 / 6, single.passes(Workload.WINDOW_STREAM), 1e-12, "single, long");
        assertEquals(1.0 / 6, single.passes(Workload.WINDOW_SHORT), 1e-12, "single, short");
    }

    @Test
    void laddersOfDiagonalGatesAreOneMergedRunInCache() {
        // A ladder of five controlled phases on qubits 0 to 5, each after an H on its target
        // (which no earlier gate of the ladder touches, so the run steps over it): all below
        // the cache block, one blocked group; the ladder merges into one table of complex
        // factors, one unit of the state in cache; the five H gates stay (half arithmetic,
        // real), two pairs and one alone. The same ladder of CZ gates: a table of real factors.
        for (boolean phases : new boolean[] {true, false}) {
            Circuit.Builder b = Circuit.builder(N);
            for (int q = 0; q < 5; q++) {
                b.h(q + 1);
                if (phases) {
                    b.cphase(q, q + 1, 0.4);
                } else {
                    b.cz(q, q + 1);
                }
            }
            Workload w = only(sv(b.measure().build(), 10, false));
            assertEquals(1, w.passes(Workload.BLOCK_STREAM), "one group");
            assertEquals(phases ? 1 : 0, w.cached(Workload.TABLE_COMPLEX), "complex run");
            assertEquals(phases ? 0 : 1, w.cached(Workload.TABLE_DIAGONAL), "real run");
            assertEquals(0, w.cached(Workload.DIAGONAL), "no lone diagonal gate");
            assertEquals(5, w.cached(Workload.DENSE1_HALF) + 2 * w.cached(
                    Workload.DENSE1_HALF_PAIR), "the five H gates");
            // Its table covers blocks of 2^6 amplitudes (qubits 0 to 5, and the smallest
            // block is 2^6): 64 entries through each of the five gates, built once.
            assertEquals(64 * 5, w.tableWork(), "table building");
        }
    }

    @Test
    void shotByShotCountsThePrefixOnceAndTheRestPerShot() {
        // h(15), measure(15 -> 0), h(15): the gate after the measurement makes it shot by shot.
        // The prefix once (1 dense pass, 1 copy made); per shot a copy of the prefix state, one
        // measurement and one dense pass; 10 shots.
        Circuit c = Circuit.builder(N, 1).h(15).measure(15, 0).h(15).build();
        EngineWork e = sv(c, 10, false);
        assertEquals(2, e.parts().size(), "prefix and per-shot parts");
        Workload prefix = e.parts().get(0).work();
        Workload shot = e.parts().get(1).work();
        assertEquals(1, prefix.passes(Workload.DENSE1_HALF), "prefix gate");
        assertEquals(1, prefix.passes(Workload.COPY), "the working copy");
        assertEquals(1, shot.passes(Workload.COPY), "a copy per shot");
        assertEquals(1, shot.passes(Workload.MEASURE), "a measurement per shot");
        assertEquals(1, shot.passes(Workload.DENSE1_HALF), "the gate after it");
        assertEquals(10, e.parts().get(1).times(), "ten shots");
        assertEquals(2 * HeapLayout.stateBytes(N, false), e.bytes(), "the state and its copy");
    }

    @Test
    void stateBytesAreSixteenPerAmplitudeInDoubleAndEightInSingle() {
        // 2^n amplitudes of 16 bytes (two doubles) or 8 (two floats), common practice; plus
        // the array headers and, under G1, whole regions for large arrays.
        for (int n : new int[] {10, 20, 26}) {
            long chunks = 1L << Math.max(0, n - 24);
            long payload = (16L << n) / chunks;
            assertEquals(chunks * HeapLayout.arrayBytes(payload) + HeapLayout.arrayBytes(8
                    * chunks), HeapLayout.stateBytes(n, false), "double, n = " + n);
            assertEquals(chunks * HeapLayout.arrayBytes(payload / 2) + HeapLayout.arrayBytes(8
                    * chunks), HeapLayout.stateBytes(n, true), "single, n = " + n);
            long plain = 16L << n;
            long taken = HeapLayout.stateBytes(n, false);
            long slack = chunks * (HeapLayout.region() + 16) + 64;
            assertTrue(taken >= plain && taken <= plain + slack, "n = " + n + ": " + taken);
        }
    }

    @Test
    void arrayHeaderAndRegionRounding() {
        // A 64-bit HotSpot array: 16-byte header, sizes in multiples of 8 (common practice).
        assertEquals(16, HeapLayout.arrayBytes(0));
        assertEquals(24, HeapLayout.arrayBytes(1));
        assertEquals(1040, HeapLayout.arrayBytes(1024));
        long region = HeapLayout.region();
        if (region > 0) {
            // G1: an object of half a region or more takes whole regions (Oracle, HotSpot GC
            // Tuning Guide, release 17, ch. 9, humongous objects).
            assertEquals(region, HeapLayout.arrayBytes(region / 2));
            assertEquals(2 * region, HeapLayout.arrayBytes(region));
        }
    }

    @Test
    void densityMatrixGatesAreTwoPassesAndChannelsOne() {
        // h(0) then cnot(0, 1) on 3 qubits, depolarizing after one-qubit gates:
        // h: 2 density-matrix 1-qubit passes on the 6-qubit storage, with half the arithmetic
        // (H is real); its channel: 1 pass of its superoperator on qubits 0 and 3;
        // cnot: 2 controlled passes over half the storage each.
        NoiseModel noise = NoiseModel.builder().afterOneQubitGates(Channel.depolarizing(0.1))
                .build();
        Circuit c = Circuit.builder(3).h(0).cnot(0, 1).measure().build();
        Simulator sim = Simulator.seeded(1).withNoise(noise)
                .withEngine(Simulator.Engine.DENSITY_MATRIX);
        RunCost cost = sim.forecast(c, 100, Calibration.quickProbe());
        assertEquals(Simulator.Engine.DENSITY_MATRIX, cost.engine());
        EngineWork e = dev.qsim.internal.Bridge.noise().work(c, noise, true, 100, 1);
        Workload w = only(e);
        assertEquals(6, w.qubits(), "storage qubits");
        assertEquals(2, w.passes(Workload.DENSITY1_HALF), "h on rows and columns");
        assertEquals(2, w.streamed(Workload.DENSITY1_HALF), "each over the whole storage");
        assertEquals(1, w.passes(Workload.DENSITY_CHANNEL1), "the channel's superoperator");
        assertEquals(1, w.streamed(Workload.DENSE1_CONTROLLED), "two passes over halves");
        assertEquals(5, w.totalPasses(), "all passes");
        assertTrue(e.bytes() >= 16L << 6, "at least 4^3 entries of 16 bytes");
        assertEquals(5, cost.passes(), 1e-12, "the forecast's count");
    }

    @Test
    void densityMatrixKindsFollowTheGateAndChannelShapes() {
        // rz(0.4) on qubit 1, then cz(1, 2) and a two-qubit depolarizing channel after it,
        // then reset(0), on 3 qubits: rz is diagonal with complex entries (the complex
        // kind, on rows and columns); cz is a two-qubit gate without controls (two passes);
        // the channel's superoperator is one four-qubit pass (qubits 1, 2, 4, 5); the reset
        // is a one-qubit channel (one pass; Kraus operators |0><0| and |0><1|, common
        // practice). Column stacking: Horn and Johnson 1991, Topics in Matrix Analysis,
        // Lemma 4.3.1.
        NoiseModel noise = NoiseModel.builder()
                .afterTwoQubitGates(Channel.twoQubitDepolarizing(0.1)).build();
        Circuit c = Circuit.builder(3).rz(1, 0.4).cz(1, 2).reset(0).measure().build();
        EngineWork e = dev.qsim.internal.Bridge.noise().work(c, noise, true, 100, 1);
        Workload w = only(e);
        assertEquals(2, w.passes(Workload.DENSITY1), "rz on rows and columns");
        assertEquals(0, w.passes(Workload.DENSITY1_HALF), "no real one-qubit gate");
        assertEquals(2, w.passes(Workload.DENSITY2), "cz on rows and columns");
        assertEquals(1, w.passes(Workload.DENSITY_CHANNEL2), "the two-qubit channel");
        assertEquals(1, w.passes(Workload.DENSITY_CHANNEL1), "the reset");
        assertEquals(6, w.totalPasses(), "all passes");
        assertEquals(6, w.streamed(Workload.DENSITY1) + w.streamed(Workload.DENSITY2)
                + w.streamed(Workload.DENSITY_CHANNEL1) + w.streamed(Workload.DENSITY_CHANNEL2),
                1e-12, "each pass over the whole storage");
    }

    @Test
    void trajectoriesCountTheExpectedPauliBranches() {
        // depolarizing(p) applies X, Y or Z with probability p (Nielsen and Chuang 2010,
        // §8.3.4, Pauli form; see Channel.depolarizing), so after h(15) the expected dense
        // passes per trajectory are 1 + p, all with half the arithmetic (H, X and Z are real, Y
        // is shaped like RX); plus one measurement per measured qubit.
        double p = 0.3;
        NoiseModel noise = NoiseModel.builder().afterOneQubitGates(Channel.depolarizing(p))
                .build();
        Circuit c = Circuit.builder(N, 1).h(15).measure(15, 0).build();
        EngineWork e = dev.qsim.internal.Bridge.noise().work(c, noise, false, 8, 2);
        EngineWork.Part part = e.parts().get(0);
        assertEquals(8, part.times(), "one per shot");
        assertEquals(2, part.workers(), "two workers");
        assertEquals(1 + p, part.work().streamed(Workload.DENSE1_HALF), 1e-12, "expected passes");
        assertEquals(1, part.work().passes(Workload.MEASURE), "one measurement");
    }

    @Test
    void theTableauCountsWordsPerGateAndMeasurement() {
        // Aaronson and Gottesman 2004, Phys. Rev. A 70, 052328, section III: a gate rewrites
        // the x and z columns of its qubits, a measurement walks every column. 100 qubits:
        // ceil(100/64) = 2 words per half column, so a column pair is 4·2 words; H on one
        // qubit 8 words, CNOT on two 16; a measurement 100 columns of 2 words = 200 words.
        Circuit c = Circuit.builder(100).h(0).cnot(0, 1).measure(0, 0).build();
        double[] w = TableauCost.terms(c, 1);
        assertEquals(1, w[TableauCost.RUNS], "one run");
        assertEquals(4 * 100 * 2, w[TableauCost.TABLE_WORDS], "x and z tables, 2n rows each");
        assertEquals(2, w[TableauCost.GATES], "gates");
        assertEquals(8 + 16, w[TableauCost.GATE_WORDS], "gate words");
        assertEquals(1, w[TableauCost.MEASUREMENTS], "measurements");
        assertEquals(100, w[TableauCost.MEASURE_COLUMNS], "measurement columns");
        assertEquals(200, w[TableauCost.MEASURE_WORDS], "measurement words");
        // 130 shots replay in ceil(130/64) = 3 batches, each taking the measurement again and
        // flipping at most n = 100 rows of the sign column.
        double[] r = TableauCost.terms(c, 130);
        assertEquals(3, r[TableauCost.BATCH_STEPS], "replayed steps");
        assertEquals(300, r[TableauCost.BATCH_ROWS], "replayed rows");
        assertEquals(1, r[TableauCost.MEASUREMENTS], "simulated once");
        assertEquals(130, r[TableauCost.SHOTS], "shots tallied");
        // 100 classical bits are wider than a tally key: each shot's 100 bits as a bitstring.
        assertEquals(130 * 100, r[TableauCost.WIDE_BITS], "bits tallied as bitstrings");
        Circuit narrow = Circuit.builder(100, 63).h(0).measure(0, 0).build();
        assertEquals(0, TableauCost.terms(narrow, 130)[TableauCost.WIDE_BITS],
                "63 bits: one key a shot");
        // Y is applied as its catalogue decomposition into the tableau's primitives; each
        // primitive on one qubit rewrites 8 words here.
        Circuit y = Circuit.builder(100).y(3).build();
        int steps = Gate.Y.cliffordSteps().size();
        assertEquals(8.0 * steps, TableauCost.terms(y, 1)[TableauCost.GATE_WORDS],
                "Y's primitive steps");
    }

    @Test
    void theLeastSquaresFitRecoversRatesAndKeepsThemNonNegative() {
        // y = 2 + 3 x1 exactly (and x2 unused by the truth): least squares returns the exact
        // coefficients of a consistent system (Lawson and Hanson 1974, chapter 23); a column
        // whose unconstrained coefficient would be negative is held at 0.
        List<double[]> x = new java.util.ArrayList<>();
        List<Double> y = new java.util.ArrayList<>();
        for (int i = 1; i <= 6; i++) {
            x.add(new double[] {1, i, 0});
            y.add(2.0 + 3.0 * i);
        }
        double[] c = EngineRates.nonNegativeFit(x, y);
        assertEquals(2, c[0], 1e-9, "intercept");
        assertEquals(3, c[1], 1e-9, "slope");
        assertEquals(0, c[2], 0, "a column of zeros");
        List<double[]> x2 = new java.util.ArrayList<>();
        List<Double> y2 = new java.util.ArrayList<>();
        for (int i = 1; i <= 6; i++) {
            x2.add(new double[] {1, i});
            y2.add(10.0 - 0.5 * i); // falls with x: the slope would be negative
        }
        double[] d = EngineRates.nonNegativeFit(x2, y2);
        assertEquals(0, d[1], 0, "held at zero");
        // Then the intercept alone, least squares with weights 1/y²: sum (1 - c/y)²/... is
        // minimised at c = sum(1/y) / sum(1/y²) (worked by hand from the normal equation).
        double s1 = 0;
        double s2 = 0;
        for (double v : y2) {
            s1 += 1 / v;
            s2 += 1 / (v * v);
        }
        assertEquals(s1 / s2, d[0], 1e-9, "the weighted mean");
    }

    @Test
    void fusionShapesMatchTheFusedGates() {
        // The counting path plans the same blocks as the run's fusion.
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(31L);
        for (int trial = 0; trial < 20; trial++) {
            Circuit.Builder b = Circuit.builder(10);
            for (int g = 0; g < 60; g++) {
                int q = rng.nextInt(10);
                int r = (q + 1 + rng.nextInt(9)) % 10;
                switch (rng.nextInt(4)) {
                    case 0:
                        b.h(q);
                        break;
                    case 1:
                        b.rz(q, 0.3);
                        break;
                    case 2:
                        b.cnot(q, r);
                        break;
                    default:
                        b.ry(q, 0.7);
                        break;
                }
            }
            List<Instruction> gates = b.build().instructions();
            List<Instruction> fused = Fusion.fuse(gates);
            List<GateOp> shapes = Fusion.shapes(gates);
            assertEquals(fused.size(), shapes.size(), "trial " + trial);
            for (int i = 0; i < fused.size(); i++) {
                assertEquals(java.util.Arrays.toString(fused.get(i).targets()),
                        java.util.Arrays.toString(targets(shapes.get(i))), "trial " + trial
                        + ", gate " + i);
            }
        }
    }

    private static int[] targets(GateOp op) {
        return op.targets();
    }

    @Test
    void forecastRefusesWhatTheRunRefuses() {
        Circuit c = Circuit.builder(2).h(0).measure().build();
        Simulator sim = Simulator.seeded(1);
        IllegalArgumentException e = org.junit.jupiter.api.Assertions.assertThrows(
                IllegalArgumentException.class, () -> sim.forecast(c, 0));
        assertTrue(e.getMessage().contains("0"), e.getMessage());
        Circuit t = Circuit.builder(2).t(0).measure().build();
        e = org.junit.jupiter.api.Assertions.assertThrows(IllegalArgumentException.class,
                () -> sim.withEngine(Simulator.Engine.TABLEAU).forecast(t, 10));
        assertTrue(e.getMessage().contains("not a Clifford gate"), e.getMessage());
    }

    @Test
    void cheaperSettingsAreOffered() {
        Calibration cal = Calibration.quickProbe();
        // A Clifford circuit of 20 qubits set to run on the state vector: the tableau and
        // single precision are offered.
        Circuit.Builder b = Circuit.builder(20);
        for (int q = 0; q < 20; q++) {
            b.h(q);
        }
        RunCost ideal = Simulator.seeded(1).withEngine(Simulator.Engine.AMPLITUDES)
                .forecast(b.measure().build(), 100, cal);
        assertEquals(Simulator.Engine.AMPLITUDES, ideal.engine());
        assertTrue(ideal.alternatives().stream().anyMatch(a -> a.change().contains("TABLEAU")),
                ideal.report());
        assertTrue(ideal.alternatives().stream().anyMatch(a -> a.change().contains("SINGLE")),
                ideal.report());
        // A density-matrix run is offered trajectories.
        NoiseModel noise = NoiseModel.builder().afterOneQubitGates(Channel.depolarizing(0.01))
                .build();
        RunCost dm = Simulator.seeded(1).withNoise(noise)
                .withEngine(Simulator.Engine.DENSITY_MATRIX)
                .forecast(Circuit.builder(8).h(0).measure().build(), 10, cal);
        assertTrue(dm.alternatives().stream().anyMatch(a -> a.change().contains("TRAJECTORIES")),
                dm.report());
        assertTrue(dm.report().contains("DENSITY_MATRIX"), dm.report());
    }
}
