package dev.qsim.examples;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;

import org.apache.commons.statistics.inference.BinomialTest;
import org.junit.jupiter.api.Test;

class RepetitionMemoryTest {

    private static final long SEED = RepetitionMemory.DEFAULT_SEED;
    private static final int SHOTS = 100;

    @Test
    void detectionsSitNextToThePlantedFlipsAndTheReadoutDecodes() {
        Capture out = new Capture();
        RepetitionMemory.Report report = RepetitionMemory.run(out.stream(), SEED, SHOTS);
        List<RepetitionMemory.Flip> flips = report.flips();
        assertTrue(!flips.isEmpty(), "the default seed should plant flips");
        // Expected detections: an X on data qubit j flips the parity checks j-1 and j, which
        // first shows in the round it precedes; each check's outcome is the parity of its two
        // data neighbours (bit-flip code syndrome, Nielsen and Chuang 2010, sec. 10.1.1), and
        // a check detects when its outcome changes. Flips in one round on both neighbours cancel.
        int[][] flipsPerRound = new int[RepetitionMemory.ROUNDS][RepetitionMemory.DATA];
        for (RepetitionMemory.Flip f : flips) {
            flipsPerRound[f.round()][f.data()] ^= 1;
        }
        long[][] det = report.detections();
        for (int r = 0; r < RepetitionMemory.ROUNDS; r++) {
            for (int i = 0; i < RepetitionMemory.CHECKS; i++) {
                boolean fires = (flipsPerRound[r][i] ^ flipsPerRound[r][i + 1]) == 1;
                assertEquals(fires ? SHOTS : 0, det[r][i], "round " + r + " check " + i);
            }
        }
        // Logical |+> is a GHZ state: with the flips undone, all zeros or all ones, each with
        // probability 1/2 (GHZ, Greenberger, Horne, Shimony and Zeilinger, Am. J. Phys. 58,
        // 1131, 1990); two-sided binomial test, Commons Statistics.
        assertEquals(SHOTS, report.decodedZeros() + report.decodedOnes());
        double p = BinomialTest.withDefaults().test(SHOTS, (int) report.decodedZeros(), 0.5)
                .getPValue();
        assertTrue(p > 1e-3, "p = " + p);
        String text = out.text();
        assertTrue(text.contains("Mainspring") && text.contains("Planted bit flips"), text);
        assertTrue(text.contains("anything else: 0."), text);
    }

    @Test
    void flipsAreReproducibleFromTheSeed() {
        assertEquals(RepetitionMemory.plantedFlips(7), RepetitionMemory.plantedFlips(7));
    }

    @Test
    void badShotsAreRefused() {
        Capture out = new Capture();
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> RepetitionMemory.fromArgs(new String[] {"1", "0"}, out.stream()));
        assertTrue(e.getMessage().contains("0"), e.getMessage());
        assertThrows(IllegalArgumentException.class,
                () -> RepetitionMemory.fromArgs(new String[] {"x"}, out.stream()));
    }
}
