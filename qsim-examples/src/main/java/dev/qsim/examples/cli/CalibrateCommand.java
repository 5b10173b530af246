package dev.qsim.examples.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.util.concurrent.Callable;

import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

import dev.qsim.Calibration;

/**
 * {@code calibrate}: measures this machine's rates for run forecasts (about a minute) and keeps
 * them in the calibration file, or with {@code --show} says which rates forecasts use now.
 */
@Command(name = "calibrate", mixinStandardHelpOptions = true,
        versionProvider = Cli.VersionText.class,
        description = "Measures this machine's speed for each kind of kernel pass (about a"
                + " minute) and keeps it in the calibration file, which run --plan-only and"
                + " --budget-time use to predict a run's time.",
        footerHeading = "%nExamples:%n",
        footer = {
            "  java -jar qsim-examples.jar calibrate",
            "  java -jar qsim-examples.jar calibrate --show",
            "%nThe file is machine-rates.properties in $XDG_CONFIG_HOME/qsim (else"
                    + " ~/.config/qsim), or in the folder of the system property"
                    + " qsim.config.dir. Without it, forecasts use a quick probe of two to"
                    + " three seconds. A file made on another processor count or with other kernel"
                    + " loops is stale and not used."})
final class CalibrateCommand implements Callable<Integer> {
    @Spec
    CommandLine.Model.CommandSpec spec;
    @Option(names = "--show", description = "print which rates forecasts use now and where the"
            + " file is; measure nothing")
    boolean show;

    @Override
    public Integer call() throws IOException {
        PrintWriter out = spec.commandLine().getOut();
        if (show) {
            out.println("file   " + Calibration.file());
            out.println("rates  " + Calibration.current().describe());
            return Cli.EXIT_OK;
        }
        PrintWriter err = spec.commandLine().getErr();
        err.println("measuring this machine's rates (about a minute)...");
        err.flush();
        Calibration c = Calibration.measure(line -> {
            err.println("  " + line);
            err.flush();
        });
        out.println("wrote " + c.save() + ": " + c.describe());
        return Cli.EXIT_OK;
    }
}
