package dev.qsim;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;

import dev.qsim.internal.Bridge;
import dev.qsim.internal.EngineWork;
import dev.qsim.kernel.Parallel;
import dev.qsim.kernel.Workload;

/**
 * Turns a run's counted work into a {@link RunCost}: each engine counts its own steps (one
 * counter per engine: {@link AmplitudeCost}, {@link TableauCost}, {@link MpsCost}, and the
 * noise engines' {@code NoiseCost} behind the bridge; a new engine adds its counter and a case
 * here), and
 * this class prices the counts with a {@link Calibration}'s rates and lists cheaper settings.
 */
final class CostModel {
    /** A setting with fewer threads is proposed when it is this close to the fastest. */
    static final double THREAD_SLACK = 1.10;

    private CostModel() {
    }

    static RunCost forecast(Simulator sim, Circuit c, int shots, Calibration cal) {
        Counted base = count(sim, c, shots);
        RunCost cost = price(base, sim.threads(), cal);
        List<RunCost.Alternative> alt = new ArrayList<>();
        boolean ideal = sim.noise().isIdeal();
        Simulator.Engine engine = cost.engine();
        if (engine == Simulator.Engine.AMPLITUDES && sim.precision() == Precision.DOUBLE) {
            offer(alt, cost, sim.withEngine(Simulator.Engine.AMPLITUDES)
                    .withPrecision(Precision.SINGLE), c, shots, cal, "withPrecision(SINGLE)",
                    "half the memory, about seven significant digits per amplitude");
        }
        if (ideal && engine != Simulator.Engine.TABLEAU && c.firstNonClifford().isEmpty()) {
            offer(alt, cost, sim.withEngine(Simulator.Engine.TABLEAU), c, shots, cal,
                    "withEngine(TABLEAU)", "exact; every gate is Clifford");
        }
        if (engine == Simulator.Engine.DENSITY_MATRIX) {
            offer(alt, cost, sim.withEngine(Simulator.Engine.TRAJECTORIES), c, shots, cal,
                    "withEngine(TRAJECTORIES)", "one trajectory per shot: the tally, not the"
                    + " exact distribution");
        }
        if (engine == Simulator.Engine.TRAJECTORIES) {
            offer(alt, cost, sim.withEngine(Simulator.Engine.DENSITY_MATRIX), c, shots, cal,
                    "withEngine(DENSITY_MATRIX)", "the exact distribution, shots drawn from it");
        }
        fewerThreads(alt, cost, base, sim, c, shots, cal);
        alt.sort(Comparator.comparingDouble(RunCost.Alternative::seconds));
        return cost.withAlternatives(alt);
    }

    private static void offer(List<RunCost.Alternative> alt, RunCost base, Simulator other,
            Circuit c, int shots, Calibration cal, String change, String why) {
        RunCost o;
        try {
            o = price(count(other, c, shots), other.threads(), cal);
        } catch (IllegalArgumentException | IllegalStateException e) {
            return; // the other engine or setting cannot run this circuit
        }
        if (o.seconds() < base.seconds() || o.bytes() < base.bytes()) {
            alt.add(new RunCost.Alternative(change, o.seconds(), o.bytes(), why));
        }
    }

    /** The fewest threads within {@link #THREAD_SLACK} of the run's time, if fewer. */
    private static void fewerThreads(List<RunCost.Alternative> alt, RunCost base, Counted counted,
            Simulator sim, Circuit c, int shots, Calibration cal) {
        int widest = 0;
        for (EngineWork.Part p : counted.work.parts()) {
            widest = Math.max(widest, p.work().qubits());
        }
        if (widest < Parallel.MIN_PARALLEL_QUBITS) {
            return; // the kernels run on one thread anyway
        }
        for (int t = 1; t < sim.threads(); t++) {
            RunCost o = counted.engine == Simulator.Engine.TRAJECTORIES
                    ? price(count(sim.withThreads(t), c, shots), t, cal) : price(counted, t, cal);
            if (o.seconds() <= THREAD_SLACK * base.seconds()) {
                alt.add(new RunCost.Alternative("withThreads(" + t + ")", o.seconds(), o.bytes(),
                        "memory bound: within " + Math.round(100 * (THREAD_SLACK - 1))
                        + " % of the time on " + sim.threads() + " threads, leaving "
                        + (sim.threads() - t) + " free"));
                return;
            }
        }
    }

    /** A run's counted work with its engine choice. */
    private record Counted(Simulator.Choice choice, Simulator.Engine engine, EngineWork work,
            Precision precision, int shots, long trajectories) {
    }

    /** Counts a run's work with the engine's own counter. */
    private static Counted count(Simulator sim, Circuit c, int shots) {
        Simulator.Choice choice = sim.explain(c, shots);
        int threads = sim.threads();
        EngineWork e;
        long trajectories = 0;
        Precision precision = sim.precision();
        switch (choice.engine()) {
            case TABLEAU:
                e = TableauCost.work(c, shots);
                break;
            case DENSITY_MATRIX:
                requireDouble(sim);
                e = Bridge.noise().work(c, sim.noise(), true, shots, threads);
                break;
            case TRAJECTORIES:
                requireDouble(sim);
                e = Bridge.noise().work(c, sim.noise(), false, shots, threads);
                trajectories = shots;
                break;
            case MATRIX_PRODUCT:
                e = MpsCost.work(c, shots, sim.bondLimit());
                precision = Precision.DOUBLE; // its tensors are always double precision
                break;
            default:
                e = AmplitudeCost.work(c, shots, precision, sim.fusion()
                        && c.qubits() >= Fusion.MIN_STATE_QUBITS, threads);
                break;
        }
        return new Counted(choice, choice.engine(), e, precision, shots, trajectories);
    }

    private static void requireDouble(Simulator sim) {
        if (sim.precision() != Precision.DOUBLE) {
            throw new IllegalArgumentException("noisy runs are in double precision; use"
                    + " withPrecision(DOUBLE) with a noise model");
        }
    }

    /** Prices counted work with the rates, every kernel pass on {@code threads} threads. */
    private static RunCost price(Counted counted, int threads, Calibration cal) {
        EngineWork e = counted.work;
        double[] nanos = new double[Workload.KINDS];
        double[] cacheNanos = new double[Workload.KINDS];
        double[] passes = new double[Workload.KINDS];
        double[] inCache = new double[Workload.KINDS];
        double planning = 0;
        double tables = 0;
        List<String> lines = new ArrayList<>();
        for (EngineWork.Part p : e.parts()) {
            Workload w = p.work();
            int n = w.qubits();
            double amps = Math.scalb(1.0, n);
            int kernelThreads = p.workers() > 1 ? p.threads() : threads;
            for (int k = 0; k < Workload.KINDS; k++) {
                double s = w.streamed(k);
                if (s > 0) {
                    nanos[k] += p.times() * s * amps * rate(cal, k, n, kernelThreads,
                            p.workers());
                }
                double cached = w.cached(k);
                if (cached > 0) {
                    cacheNanos[k] += p.times() * cached * amps
                            * cal.cached(k, n, kernelThreads, p.workers());
                    inCache[k] += p.times() * cached;
                }
                passes[k] += p.times() * w.passes(k);
            }
            int busy = Math.max(1, Math.min(p.workers(), cal.processors()));
            planning += p.times() * (w.planned() * cal.planNanos() + w.fused()
                    * cal.fuseNanos()) / busy;
            tables += p.times() * w.tableWork() * cal.tableNanos() / busy;
        }
        if (planning > 0) {
            lines.add(String.format(Locale.ROOT, "planning and fusing the gates: %s",
                    RunCost.secondsText(planning * 1e-9)));
        }
        if (tables > 0) {
            lines.add(String.format(Locale.ROOT, "building the merged runs' tables: %s",
                    RunCost.secondsText(tables * 1e-9)));
        }
        double total = planning + tables;
        double totalPasses = 0;
        for (int k = 0; k < Workload.KINDS; k++) {
            total += nanos[k] + cacheNanos[k];
            totalPasses += passes[k];
            if (passes[k] > 0) {
                lines.add(String.format(Locale.ROOT, "%s %s pass%s: %s", amount(passes[k]),
                        Workload.name(k), passes[k] == 1 ? "" : "es",
                        RunCost.secondsText(nanos[k] * 1e-9)));
            }
        }
        for (int k = 0; k < Workload.KINDS; k++) {
            if (inCache[k] > 0) {
                lines.add(String.format(Locale.ROOT, "%s %s in cache (state-sized units): %s",
                        amount(inCache[k]), Workload.name(k),
                        RunCost.secondsText(cacheNanos[k] * 1e-9)));
            }
        }
        double[] tab = e.tableauTerms();
        if (tab.length > 0) {
            double[] r = cal.tableauRates();
            double t = 0;
            for (int i = 0; i < tab.length; i++) {
                t += tab[i] * r[i];
            }
            total += t;
            lines.add(String.format(Locale.ROOT, "%s tableau gates (%s words), %s measurements"
                    + " (%s words), %s replayed measurement steps: %s",
                    amount(tab[TableauCost.GATES]), amount(tab[TableauCost.GATE_WORDS]),
                    amount(tab[TableauCost.MEASUREMENTS]), amount(tab[TableauCost.MEASURE_WORDS]),
                    amount(tab[TableauCost.BATCH_STEPS]), RunCost.secondsText(t * 1e-9)));
        }
        if (e.mpsUnits() > 0) {
            double t = e.mpsUnits() * cal.mpsUnitNanos();
            total += t;
            lines.add(String.format(Locale.ROOT, "%s block updates of the matrix product state"
                    + " (bond dimension up to %.0f, an upper bound): %s", amount(e.mpsUpdates()),
                    e.mpsLargestBond(), RunCost.secondsText(t * 1e-9)));
        }
        if (e.shots() > 0) {
            double t = e.shots() * cal.shotNanos() + e.shotBits() * cal.shotBitNanos();
            total += t;
            lines.add(String.format(Locale.ROOT, "%s shots drawn and tallied: %s",
                    amount(e.shots()), RunCost.secondsText(t * 1e-9)));
        }
        return new RunCost(counted.choice, counted.precision, threads, counted.shots,
                counted.trajectories, total * 1e-9, e.bytes(), totalPasses, cal.describe(),
                lines, e.held(), List.of());
    }

    /** Per-unit time of a kind for one of {@code workers} independent workers at once. */
    private static double rate(Calibration cal, int k, int n, int threads, int workers) {
        if (workers <= 1) {
            return cal.nanos(k, n, threads);
        }
        int busy = Math.min(workers, Math.max(1, cal.processors()));
        double alone = cal.nanos(k, n, 1) / busy;
        if (n < Parallel.MIN_PARALLEL_QUBITS) {
            return alone; // small states: the rates on every processor were not measured apart
        }
        // No faster than the machine was measured to go with every processor on one state.
        return Math.max(alone, cal.nanos(k, n, busy));
    }

    private static String amount(double x) {
        return Math.abs(x - Math.rint(x)) < 1e-9 ? String.format(Locale.ROOT, "%.0f", x)
                : String.format(Locale.ROOT, "%.2f", x);
    }
}
