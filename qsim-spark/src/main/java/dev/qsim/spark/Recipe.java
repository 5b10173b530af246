package dev.qsim.spark;

import java.io.Serializable;

import dev.qsim.Circuit;
import dev.qsim.noise.DeviceProfile;
import dev.qsim.noise.NoiseModel;
import dev.qsim.text.QasmReader;

/**
 * How to make a value on each executor: qsim's circuits, observables and noise models are
 * immutable values but not {@link Serializable}, so a job ships the recipe (a serializable
 * lambda or object) and each executor makes the value once per partition. A recipe must make
 * equal values every time it is called, on any machine; the jobs call it once on the driver
 * too, to check the value before any work is sent out.
 *
 * <p>A lambda becomes serializable when its target type is, so
 * {@code Recipe<TunableCircuit> c = () -> MyAnsatz.build(4);} ships {@code MyAnsatz} by name
 * (its class must be on the executors' class path, as in the jar given to
 * {@code spark-submit}), and any values the lambda captures must be serializable.
 *
 * @param <T> the type of value made
 * @since 0.1
 */
@FunctionalInterface
public interface Recipe<T> extends Serializable {
    /**
     * Makes the value.
     *
     * @return the value, never {@code null}
     */
    T make();

    /**
     * Returns a recipe that reads an OpenQASM 3 program ({@link QasmReader#read(String)}).
     * The text is read once here, so that a malformed program is refused before any work.
     *
     * @param program the program text
     * @return the recipe
     * @throws dev.qsim.text.CircuitFormatException if the text is not a program the reader
     *     accepts (the message gives line and column)
     */
    static Recipe<Circuit> qasm(String program) {
        QasmReader.read(program);
        return () -> QasmReader.read(program);
    }

    /**
     * Returns a recipe for the noise model of a device profile
     * ({@link DeviceProfile#read(String)}, {@link DeviceProfile#noiseModel()}). The text is
     * read once here, so that a malformed profile is refused before any work.
     *
     * @param profile the device profile's JSON text
     * @return the recipe
     * @throws IllegalArgumentException if the profile is malformed (the message names the
     *     field and position)
     */
    static Recipe<NoiseModel> deviceNoise(String profile) {
        DeviceProfile.read(profile);
        return () -> DeviceProfile.read(profile).noiseModel();
    }
}
