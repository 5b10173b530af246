package dev.qsim.bench;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

import dev.qsim.Operator;
import dev.qsim.bench.BatchTimer.Timing;
import dev.qsim.examples.cli.Progress;

/**
 * The matrix-product-state rows of {@code --mps on}: the time of one two-qubit gate on the
 * middle bonds of a {@value #CHAIN}-qubit chain brought to bond dimension χ = 8, 16, ..., 128
 * ({@link MatrixProductReport#timeAtBond}), and the exponent of χ fitted over χ ≥ 32. Each
 * gate splits a {@code 2χ x 2χ} block with a singular value decomposition, {@code O(χ³)}
 * (Schollwöck 2011, Annals of Physics 326, 96, sec. 4.5), so the exponent should be near 3.
 *
 * <p>Row fields: {@code n} is the chain length, {@code kernel} {@code mps-two-qubit},
 * {@code target} {@code chi=χ}, one thread; the streamed vector is the two-site block, a
 * {@code 2χ x 2χ} matrix of {@code 4χ²} complex entries, counted as a vector of
 * {@code 2 + 2 log2 χ} qubits, so {@code gb_per_s} compares the gate with the probe at the same
 * size (the SVD's arithmetic, not memory, bounds it).
 */
final class BondRows {
    /** The chain length of the rows. */
    static final int CHAIN = 24;
    /** The bond dimensions timed. */
    static final int[] CHIS = {8, 16, 32, 64, 128};
    /** The smallest bond dimension in the fit. */
    static final int FIT_FROM = 32;

    private final ReportSettings settings;
    private final BandwidthProbe probe;
    private final Progress progress;
    private double exponent = Double.NaN;

    BondRows(ReportSettings settings, BandwidthProbe probe, Progress progress) {
        this.settings = settings;
        this.probe = probe;
        this.progress = progress;
    }

    /** Measures one row per bond dimension and fits the exponent. */
    List<ReportRow> measure() {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(2026L);
        Operator[] gates = new Operator[16];
        for (int g = 0; g < gates.length; g++) {
            gates[g] = MatrixProductReport.randomUnitary(rng);
        }
        List<ReportRow> rows = new ArrayList<>();
        List<double[]> fit = new ArrayList<>();
        for (int chi : CHIS) {
            int vector = 2 + 2 * Integer.numberOfTrailingZeros(chi);
            ReportRunner.Bandwidth bandwidth = NoiseRows.probeAt(probe, vector,
                    settings.targetNanos());
            progress.show("mps chi=" + chi);
            Timing t = MatrixProductReport.timeAtBond(CHAIN, chi, gates, rng, settings.millis());
            ReportRow row = new ReportRow(CHAIN, "mps-two-qubit", "chi=" + chi, 1, t.perRep(),
                    bandwidth.copyGbps(), bandwidth.triadGbps(), vector, 1);
            rows.add(row);
            if (chi >= FIT_FROM) {
                fit.add(new double[] {chi, t.perRep()});
            }
            progress.done(String.format(Locale.ROOT, "# mps chi=%d: two-qubit gate %.3f ms (%s)",
                    chi, t.perRep() / 1e6, ReportRunner.count(t.reps(), "repetition")));
        }
        double[] x = new double[fit.size()];
        double[] y = new double[fit.size()];
        for (int i = 0; i < x.length; i++) {
            x[i] = fit.get(i)[0];
            y[i] = fit.get(i)[1];
        }
        exponent = MatrixProductReport.slope(x, y);
        return rows;
    }

    /** The fitted exponent of χ after {@link #measure()}. */
    double exponent() {
        return exponent;
    }
}
