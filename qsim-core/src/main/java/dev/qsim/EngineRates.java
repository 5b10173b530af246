package dev.qsim;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

import org.apache.commons.rng.UniformRandomProvider;
import org.apache.commons.rng.simple.RandomSource;

import dev.qsim.kernel.Workload;

/**
 * The engines' rates that {@link Calibration} measures beyond the state vector's kernels: the
 * matrix product state's work unit, the tally's cost per shot and per bit, the tableau's terms
 * (fitted by non-negative least squares: C. L. Lawson and R. J. Hanson, "Solving Least Squares
 * Problems", 1974, ch. 23, from memory), and the planner's cost per gate. Each is timed through
 * the engine's own public path. Internal.
 */
final class EngineRates {
    private EngineRates() {
    }

    /**
     * Nanoseconds per unit of matrix-product-state work ({@link MpsCost}): two-site updates on
     * the middle bonds of a 12-qubit chain held at bond dimension 32, each a split of a
     * 64 x 64 block, {@code 64³} units.
     */
    static double mpsUnitNanos(long nanos, boolean quick) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(31L);
        int n = 12;
        int chi = 32;
        dev.qsim.mps.MatrixProductState s = dev.qsim.mps.MatrixProductState.zero(n, chi, 0);
        for (int layer = 0; layer < 2 * n; layer++) {
            for (int q = layer % 2; q + 1 < n; q += 2) {
                s.apply(Gates.u(1 + rng.nextDouble(), rng.nextDouble(), rng.nextDouble())
                        .tensor(Gates.u(1 + rng.nextDouble(), 0.3, 0.7)).times(Gates.CNOT), q,
                        q + 1);
            }
        }
        Operator g = Gates.u(1.1, 0.2, 0.3).tensor(Gates.u(0.7, 0.4, 0.9)).times(Gates.CNOT);
        int mid = n / 2;
        Runnable eight = () -> {
            for (int r = 0; r < 8; r++) {
                s.apply(g, mid - 1 + (r & 1), mid + (r & 1));
            }
        };
        for (int warm = 0; warm < 6; warm++) {
            eight.run(); // the decomposition's loops compiled before timing
        }
        double perGate = best(eight, quick ? nanos : Math.max(nanos, 30_000_000L)) / 8;
        double block = 2.0 * chi;
        return perGate / (block * block * block);
    }

    /**
     * Nanoseconds per shot drawn from a final state and tallied beyond the sampling pass: per
     * shot, and per classical bit of a shot (from registers of 4 and 20 bits).
     */
    static double[] shotNanos(long nanos, int many) {
        double[] per = new double[2];
        int[] widths = {4, 20};
        for (int i = 0; i < 2; i++) {
            Circuit c = spread(widths[i]).measure().build();
            Simulator sim = Simulator.seeded(1).withThreads(1).withFusion(false);
            long[] seed = {1};
            double few = best(() -> sim.withSeed(seed[0]++).run(c, 1), nanos);
            double lots = best(() -> sim.withSeed(seed[0]++).run(c, many), nanos);
            per[i] = Math.max(1, (lots - few) / many);
        }
        double bit = Math.max(0, (per[1] - per[0]) / (widths[1] - widths[0]));
        return new double[] {Math.max(1, per[0] - bit * widths[0]), bit};
    }

    /**
     * Tableau rates, nanoseconds per unit of each of {@link TableauCost}'s terms, fitted by
     * least squares (relative residuals, no rate below zero) to runs at several sizes, chosen
     * so that each term dominates somewhere: random H, S and CNOT circuits of two lengths
     * without measurements (per run and per table word from what the lengths share, per gate
     * where the table is one word high and per gate word where it is many), the longer one
     * with every qubit measured once (per measurement, per column, per word), and that one
     * with many shots (per replayed step and row, per shot: the tableau's tally is fitted
     * with it, not priced at the state vector's shot rates).
     */
    static double[] tableauNanos(long nanos, boolean quick) {
        int[] sizes = quick ? new int[] {32, 160, 640} : new int[] {32, 96, 256, 512, 1024};
        int shots = quick ? 640 : 3200;
        long each = Math.max(1_000_000L, quick ? nanos : nanos / 3);
        List<double[]> x = new ArrayList<>();
        List<Double> y = new ArrayList<>();
        // Through the library call a user makes: its checks and engine choice cost per gate.
        Simulator tableau = Simulator.seeded(3).withEngine(Simulator.Engine.TABLEAU);
        long[] seed = {3};
        for (int pass = 0; pass < 2; pass++) {
            boolean warm = pass == 0;
            for (int n : sizes) {
                if (warm && n > sizes[1]) {
                    continue; // the small sizes compile the loops; no rows from them
                }
                // Gates in proportion to the qubits (10 and 30 a qubit, as circuits of some
                // depth have): a measurement's cost depends on how scrambled the table is. With
                // a fixed 600 gates most of 1,024 qubits were never touched, their measurements
                // took the cheap deterministic path, and the fitted rate per word came out near
                // 0, half the time of scrambled circuits at 1,000 qubits.
                Circuit shortRun = clifford(n, Math.max(600, 10 * n)).build();
                Circuit longRun = clifford(n, Math.max(3000, 30 * n)).build();
                Circuit measured = clifford(n, Math.max(600, 10 * n)).measure().build();
                // One measured qubit with many shots: a replayed step per batch instead of n,
                // so the tally's cost per shot is told apart from the replay's per step (with
                // every qubit measured the two grow together, shots/64 steps a qubit).
                Circuit measuredOne = clifford(n, Math.max(600, 10 * n)).measure(0, 0).build();
                Object[][] runs = {{shortRun, 1}, {longRun, 1}, {measured, 1},
                    {measured, shots}, {measuredOne, 4 * shots}};
                for (Object[] run : runs) {
                    Circuit c = (Circuit) run[0];
                    int s = (Integer) run[1];
                    // The calibration's warm pass runs each small case for a while: the
                    // tableau's runs of a fraction of a millisecond took 3 to 8 times as long
                    // before the JIT had compiled their steps (a 20-qubit run with 1,000 shots:
                    // 1.1 ms in its first 0.2 s, 0.24 after 0.8 s, 0.14 from 1.2 s on).
                    if (warm) {
                        long until = System.nanoTime() + (quick ? 0 : 10 * each);
                        do {
                            tableau.run(c, s);
                        } while (System.nanoTime() < until);
                        continue;
                    }
                    // A new seed each run, as a user's runs draw new outcomes: one run
                    // repeated with one seed repeats its random draws, and a processor's
                    // branch predictor can learn a short run's draws by heart.
                    double t = best(() -> tableau.withSeed(seed[0]++).run(c, s), each);
                    x.add(TableauCost.terms(c, s));
                    y.add(t);
                }
            }
        }
        return nonNegativeFit(x, y);
    }

    /** Random H, S and CNOT gates on n qubits, seeded. */
    static Circuit.Builder clifford(int n, int gates) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(17L);
        Circuit.Builder b = Circuit.builder(n);
        for (int g = 0; g < gates; g++) {
            int q = rng.nextInt(n);
            int p = (q + 1 + rng.nextInt(n - 1)) % n;
            if (g % 3 == 0) {
                b.h(q);
            } else if (g % 3 == 1) {
                b.s(q);
            } else {
                b.cnot(q, p);
            }
        }
        return b;
    }

    /**
     * Least squares with no coefficient below zero, residuals relative to y: solves the
     * normal equations on the columns still in play, and while some coefficient is negative,
     * takes the most negative out (the active-set idea of C. L. Lawson and R. J. Hanson,
     * "Solving Least Squares Problems", Prentice-Hall 1974, chapter 23, in its simplest
     * form). Columns that are zero in every row, or that depend on the others, get 0.
     */
    static double[] nonNegativeFit(List<double[]> x, List<Double> y) {
        int m = x.get(0).length;
        boolean[] on = new boolean[m];
        for (double[] row : x) {
            for (int j = 0; j < m; j++) {
                on[j] |= row[j] != 0;
            }
        }
        while (true) {
            double[] c = leastSquares(x, y, on);
            int worst = -1;
            for (int j = 0; j < m; j++) {
                if (on[j] && c[j] < 0 && (worst < 0 || c[j] < c[worst])) {
                    worst = j;
                }
            }
            if (worst < 0) {
                return c;
            }
            on[worst] = false;
        }
    }

    /**
     * Weighted least squares (rows divided by |y|) over the columns marked on, by the normal
     * equations on columns scaled to unit size; a column that depends on the others (its
     * pivot vanishes) is marked off and gets 0.
     */
    static double[] leastSquares(List<double[]> x, List<Double> y, boolean[] on) {
        int m = on.length;
        while (true) {
            int k = 0;
            int[] idx = new int[m];
            for (int j = 0; j < m; j++) {
                if (on[j]) {
                    idx[k++] = j;
                }
            }
            double[] scale = new double[k];
            for (int i = 0; i < x.size(); i++) {
                double w = 1 / Math.max(1e-9, Math.abs(y.get(i)));
                for (int j = 0; j < k; j++) {
                    scale[j] = Math.max(scale[j], Math.abs(x.get(i)[idx[j]] * w));
                }
            }
            double[][] a = new double[k][k + 1];
            for (int i = 0; i < x.size(); i++) {
                double w = 1 / Math.max(1e-9, Math.abs(y.get(i)));
                double[] row = x.get(i);
                for (int j = 0; j < k; j++) {
                    double xj = row[idx[j]] * w / scale[j];
                    for (int l = 0; l < k; l++) {
                        a[j][l] += xj * row[idx[l]] * w / scale[l];
                    }
                    a[j][k] += xj * y.get(i) * w;
                }
            }
            // Elimination without pivoting (the matrix is symmetric, positive semidefinite).
            int dependent = -1;
            for (int j = 0; j < k && dependent < 0; j++) {
                if (a[j][j] < 1e-9) {
                    dependent = idx[j];
                    break;
                }
                for (int r = j + 1; r < k; r++) {
                    double f = a[r][j] / a[j][j];
                    for (int l = j; l <= k; l++) {
                        a[r][l] -= f * a[j][l];
                    }
                }
            }
            if (dependent >= 0) {
                on[dependent] = false;
                continue;
            }
            double[] d = new double[k];
            for (int j = k - 1; j >= 0; j--) {
                double v = a[j][k];
                for (int l = j + 1; l < k; l++) {
                    v -= a[j][l] * d[l];
                }
                d[j] = v / a[j][j];
            }
            double[] c = new double[m];
            for (int j = 0; j < k; j++) {
                c[idx[j]] = d[j] / scale[j];
            }
            return c;
        }
    }

    /**
     * Nanoseconds to plan one gate (with the run's check of the circuit and choice of engine,
     * {@link Simulator#explain}), and to fuse one gate, on a random 16-qubit circuit of
     * rotation layers with CZ and CNOT gates (the planning is timed on a storage without
     * amplitudes, so no pass is included), and to build a merged run's tables, per entry and
     * gate ({@link dev.qsim.kernel.KernelTimer#tableBuildNanos}).
     */
    static double[] planNanos(long nanos) {
        UniformRandomProvider rng = RandomSource.XO_RO_SHI_RO_128_PP.create(29L);
        int n = 16;
        Circuit.Builder b = Circuit.builder(n);
        for (int layer = 0; layer < 40; layer++) {
            for (int q = 0; q < n; q++) {
                b.ry(q, 0.1 + rng.nextDouble());
                b.rz(q, 0.1 + rng.nextDouble());
            }
            for (int q = layer % 2; q + 1 < n; q += 2) {
                b.cz(q, q + 1);
            }
            b.cnot(rng.nextInt(n / 2), n / 2 + rng.nextInt(n / 2));
        }
        List<Instruction> gates = b.build().instructions();
        List<dev.qsim.kernel.GateOp> plans = new java.util.ArrayList<>();
        for (Instruction g : gates) {
            plans.add(g.plan());
        }
        double plan = best(() -> Workload.of(n, false).gates(plans), nanos) / plans.size();
        double fuse = best(() -> Fusion.fuse(gates), nanos) / gates.size();
        // A run also checks the circuit and chooses its engine, per gate.
        Circuit c = b.build();
        Simulator sim = Simulator.seeded(1);
        double choose = best(() -> sim.explain(c, 1000), nanos) / gates.size();
        double table = dev.qsim.kernel.KernelTimer.tableBuildNanos(nanos);
        return new double[] {plan + choose, fuse, table};
    }

    static double best(Runnable r, long nanos) {
        double[] t = new double[16];
        int count = 0;
        r.run();
        long start = System.nanoTime();
        while (count < t.length && (count < 3 || System.nanoTime() - start < nanos)) {
            long t0 = System.nanoTime();
            r.run();
            t[count++] = System.nanoTime() - t0;
        }
        Arrays.sort(t, 0, count);
        return t[count / 2];
    }

    /** A layer of Hadamards on n qubits (a spread distribution to sample from). */
    static Circuit.Builder spread(int n) {
        Circuit.Builder b = Circuit.builder(n);
        for (int q = 0; q < n; q++) {
            b.h(q);
        }
        return b;
    }
}
