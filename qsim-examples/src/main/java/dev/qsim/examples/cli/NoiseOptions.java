package dev.qsim.examples.cli;

import java.io.IOException;
import java.nio.file.Path;

import picocli.CommandLine.Option;

import dev.qsim.Circuit;
import dev.qsim.noise.Channel;
import dev.qsim.noise.DeviceProfile;
import dev.qsim.noise.NoiseModel;
import dev.qsim.stats.ErrorRates;

/**
 * The noise options {@code run} and {@code compare} share: uniform depolarizing and readout
 * error, or a device profile file. A device profile also checks that the circuit uses only
 * the device's couplings.
 */
final class NoiseOptions {
    @Option(names = "--depolarizing", defaultValue = "0", paramLabel = "P",
            converter = OptionValues.Probability.class,
            description = "noise: a depolarizing channel of probability P after every one- and"
                    + " two-qubit gate (default ${DEFAULT-VALUE}: none)")
    double depolarizing;
    @Option(names = "--readout-error", defaultValue = "0", paramLabel = "P",
            converter = OptionValues.Probability.class,
            description = "noise: each measured bit reads wrong with probability P (default"
                    + " ${DEFAULT-VALUE}: none)")
    double readoutError;
    @Option(names = "--device", paramLabel = "PROFILE.json",
            description = "noise: the device profile's noise (relaxation and dephasing during"
                    + " gates and delays, gate errors, readout errors; docs/device-profile.md);"
                    + " the circuit must use only the device's couplings")
    Path device;

    /** Whether any noise was asked for. */
    boolean noisy() {
        return device != null || depolarizing != 0 || readoutError != 0;
    }

    /** Checks the combination and the device file, before any work. */
    void check() {
        if (device != null && (depolarizing != 0 || readoutError != 0)) {
            throw new IllegalArgumentException("--device gives the noise of a device profile;"
                    + " give it alone, without --depolarizing or --readout-error");
        }
        if (device != null) {
            FileChecks.requireInput(device, "a device profile (JSON, docs/device-profile.md)");
        }
    }

    /**
     * The uniform rates of {@code --depolarizing} and {@code --readout-error} as a fit's fixed
     * rates, each cut to its kind's range (a fit's rates stop where more noise stops making a
     * difference).
     */
    ErrorRates rates() {
        double ro = Math.min(readoutError, 0.5);
        return new ErrorRates(Math.min(depolarizing, 0.75), Math.min(depolarizing, 15.0 / 16),
                ro, ro);
    }

    /**
     * Returns the noise model for a circuit: the device's (after checking the circuit's
     * couplings), the uniform rates', or none.
     *
     * @param circuit the circuit to run
     * @param circuitFile its file, for messages
     * @return the model
     * @throws IOException if the profile cannot be read
     */
    NoiseModel model(Circuit circuit, Path circuitFile) throws IOException {
        if (device != null) {
            DeviceProfile profile;
            try {
                profile = DeviceProfile.read(device);
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException(device + ": " + e.getMessage(), e);
            }
            try {
                profile.requireCouplings(circuit);
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException(circuitFile + ": " + e.getMessage(), e);
            }
            return profile.noiseModel();
        }
        if (depolarizing == 0 && readoutError == 0) {
            return NoiseModel.none();
        }
        NoiseModel.Builder b = NoiseModel.builder();
        if (depolarizing != 0) {
            b.afterOneQubitGates(Channel.depolarizing(depolarizing))
                    .afterTwoQubitGates(Channel.twoQubitDepolarizing(depolarizing));
        }
        return b.readoutError(readoutError, readoutError).build();
    }

    /** The noise in words, for reports and picture titles. */
    String describe() {
        if (device != null) {
            return "device profile " + device.getFileName();
        }
        if (!noisy()) {
            return "noiseless";
        }
        return "depolarizing " + Cli.plain(depolarizing) + ", readout error "
                + Cli.plain(readoutError);
    }
}
