package dev.qsim.examples.cli;

import java.nio.file.Path;
import java.util.Optional;

import picocli.CommandLine;
import picocli.CommandLine.Option;

import dev.qsim.Calibration;
import dev.qsim.Circuit;
import dev.qsim.RunCost;
import dev.qsim.Simulator;

/**
 * The forecast options of {@code run}: {@code --plan-only} prints the predicted cost instead of
 * running, {@code --budget-time} and {@code --budget-memory} refuse a run predicted to exceed
 * them; the progress display shows the predicted time left when a calibration file is in use.
 */
final class RunBudget {
    @Option(names = "--plan-only", description = "print the run's predicted time and memory on"
            + " this machine, the work counted and cheaper settings, without running it")
    boolean planOnly;
    @Option(names = "--budget-time", paramLabel = "DURATION",
            converter = OptionValues.Duration.class,
            description = "refuse the run if it is predicted to take longer, such as 90s, 5min"
                    + " or 2h")
    Double seconds;
    @Option(names = "--budget-memory", paramLabel = "SIZE", converter = OptionValues.Size.class,
            description = "refuse the run if it is predicted to hold more memory, such as 512MiB"
                    + " or 8GiB")
    Long bytes;

    /**
     * Forecasts the run when asked to, prints the plan or refuses it, and returns the progress
     * display to run under (with the predicted time when known), or null after a plan only.
     */
    Progress check(CommandLine.Model.CommandSpec spec, Path file, Circuit c, Simulator sim,
            int shots, String label) {
        RunCost cost = null;
        if (planOnly || seconds != null || bytes != null) {
            try {
                cost = sim.forecast(c, shots);
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException(file + ": " + e.getMessage(), e);
            }
        } else if (System.console() != null) {
            Optional<Calibration> saved = Calibration.saved();
            if (saved.isPresent()) {
                try {
                    cost = sim.forecast(c, shots, saved.get());
                } catch (IllegalArgumentException e) {
                    cost = null; // the run itself will refuse with the reason
                }
            }
        }
        if (planOnly) {
            spec.commandLine().getOut().print(cost.report());
            long max = Runtime.getRuntime().maxMemory();
            spec.commandLine().getOut().println("heap       " + RunCost.bytesText(max)
                    + " maximum in this JVM" + (cost.bytes() > max ? ": too small for this run,"
                    + " raise -Xmx" : ""));
            spec.commandLine().getOut().flush();
            return null;
        }
        if (seconds != null && cost.seconds() > seconds) {
            throw new IllegalArgumentException(file + ": the run is predicted to take "
                    + RunCost.secondsText(cost.seconds()) + " on " + cost.engine() + ", over"
                    + " --budget-time " + RunCost.secondsText(seconds) + cheaper(cost)
                    + "; see --plan-only");
        }
        if (bytes != null && cost.bytes() > bytes) {
            throw new IllegalArgumentException(file + ": the run is predicted to hold "
                    + RunCost.bytesText(cost.bytes()) + " on " + cost.engine() + ", over"
                    + " --budget-memory " + RunCost.bytesText(bytes) + cheaper(cost)
                    + "; see --plan-only");
        }
        return cost == null ? Progress.start(spec.commandLine().getErr(), label)
                : Progress.forecast(spec.commandLine().getErr(), label, cost.seconds());
    }

    private static String cheaper(RunCost cost) {
        if (cost.alternatives().isEmpty()) {
            return "";
        }
        RunCost.Alternative a = cost.alternatives().get(0);
        return " (" + a.change() + " is predicted at " + RunCost.secondsText(a.seconds())
                + " and " + RunCost.bytesText(a.bytes()) + ")";
    }
}
