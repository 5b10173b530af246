package dev.qsim.examples;

import java.io.PrintStream;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Objects;

import org.apache.commons.numbers.complex.Complex;

import dev.qsim.Circuit;
import dev.qsim.Simulator;
import dev.qsim.StateVector;
import dev.qsim.Tally;

/**
 * Teleporting one qubit's state with two classical bits and a shared Bell pair.
 *
 * <p><b>Scenario (invented).</b> In the Hollin Vale optics lab, the "Arbor" bench prepares a
 * polarisation setting on its qubit and must hand it to the "Bezel" bench across the room. The
 * two benches share one entangled pair and a two-wire signal cable, but no way to carry the qubit
 * itself. Arbor measures twice and sends two bits; Bezel applies X and/or Z depending on them.
 *
 * <p><b>Method.</b> Quantum teleportation (C. H. Bennett, G. Brassard, C. Cr&eacute;peau,
 * R. Jozsa, A. Peres and W. K. Wootters, "Teleporting an unknown quantum state via dual classical
 * and Einstein-Podolsky-Rosen channels", Phys. Rev. Lett. 70, 1895, 1993; circuit as in
 * M. A. Nielsen and I. L. Chuang, <i>Quantum Computation and Quantum Information</i>, Cambridge
 * University Press, 2010, section 1.3.7, figure 1.13). Qubit 0 holds the message
 * {@code rz(phi) ry(theta) |0>}, whose amplitudes are
 * {@code (cos(theta/2) e^{-i phi/2}, sin(theta/2) e^{i phi/2})}; qubits 1 and 2 hold the pair.
 * After the two mid-circuit measurements, {@code ifBit} blocks apply X (if clbit 1 is 1) and Z
 * (if clbit 0 is 1) to qubit 2. The result is checked two ways: a seeded tally of qubit 2, whose
 * frequency of 1 should be {@code sin^2(theta/2)}, and the state after single shots, where qubit 2
 * should hold the message exactly, up to a global phase, in each of the four measurement
 * branches.
 *
 * <p>Run with {@code java -jar qsim-examples.jar teleport [seed [shots]]}.
 */
public final class Teleportation {

    /** Polar angle of the message used by the command line, in radians. */
    public static final double DEFAULT_THETA = 1.1;

    /** Azimuthal angle of the message used by the command line, in radians. */
    public static final double DEFAULT_PHI = 0.7;

    /** Seed used when none is given. */
    public static final long DEFAULT_SEED = 4_096L;

    /** Shots used when none are given. */
    public static final int DEFAULT_SHOTS = 4_000;

    /** How many consecutive seeds are tried to see each measurement branch once. */
    static final int BRANCH_SEEDS = 64;

    private Teleportation() {
    }

    /**
     * One single-shot run: the two bits the sender measured and the receiver's qubit after the
     * corrections.
     *
     * @param seed the simulator seed of this shot
     * @param bit0 the bit measured on qubit 0 (clbit 0)
     * @param bit1 the bit measured on qubit 1 (clbit 1)
     * @param zero amplitude of |0&gt; on qubit 2
     * @param one amplitude of |1&gt; on qubit 2
     * @param fidelity |&lt;message|qubit 2&gt;|^2
     */
    public record Branch(long seed, int bit0, int bit1, Complex zero, Complex one,
            double fidelity) {

        /**
         * Checks the arguments.
         *
         * @param seed the simulator seed of this shot
         * @param bit0 the bit measured on qubit 0
         * @param bit1 the bit measured on qubit 1
         * @param zero amplitude of |0&gt; on qubit 2
         * @param one amplitude of |1&gt; on qubit 2
         * @param fidelity overlap with the message
         */
        public Branch {
            Objects.requireNonNull(zero, "zero");
            Objects.requireNonNull(one, "one");
        }
    }

    /**
     * What the teleportation run found.
     *
     * @param theta polar angle of the message, radians
     * @param phi azimuthal angle of the message, radians
     * @param tally seeded tally over clbits 0, 1 (the sent bits) and 2 (qubit 2 read at the end)
     * @param branches one single-shot run per measurement branch seen, in order of first sight
     */
    public record Result(double theta, double phi, Tally tally, List<Branch> branches) {

        /**
         * Checks and copies the arguments.
         *
         * @param theta polar angle of the message
         * @param phi azimuthal angle of the message
         * @param tally seeded tally
         * @param branches the single-shot runs; copied
         */
        public Result {
            Objects.requireNonNull(tally, "tally");
            branches = List.copyOf(branches);
        }

        /**
         * Returns how many shots read qubit 2 as 1 (clbit 2, the leftmost character).
         *
         * @return count of shots with clbit 2 set
         */
        public long receivedOnes() {
            long ones = 0;
            for (Map.Entry<String, Long> e : tally.outcomes().entrySet()) {
                if (e.getKey().charAt(0) == '1') {
                    ones += e.getValue();
                }
            }
            return ones;
        }

        /**
         * Returns the probability of reading 1 on the message qubit, {@code sin^2(theta/2)}.
         *
         * @return the ideal probability of 1
         */
        public double expectedOne() {
            double s = Math.sin(theta / 2);
            return s * s;
        }

        /**
         * Returns the smallest fidelity over the single-shot runs.
         *
         * @return the worst fidelity, or NaN if there were no runs
         */
        public double worstFidelity() {
            double worst = Double.NaN;
            for (Branch b : branches) {
                worst = Double.isNaN(worst) ? b.fidelity() : Math.min(worst, b.fidelity());
            }
            return worst;
        }
    }

    /**
     * Returns the message amplitudes {@code (cos(theta/2) e^{-i phi/2}, sin(theta/2) e^{i phi/2})},
     * that is {@code rz(phi) ry(theta) |0>} with the conventions of {@link dev.qsim}.
     *
     * @param theta polar angle, radians
     * @param phi azimuthal angle, radians
     * @return the two amplitudes, |0&gt; first
     */
    public static Complex[] message(double theta, double phi) {
        double c = Math.cos(theta / 2);
        double s = Math.sin(theta / 2);
        double re = Math.cos(phi / 2);
        double im = Math.sin(phi / 2);
        return new Complex[] {
            Complex.ofCartesian(c * re, -c * im),
            Complex.ofCartesian(s * re, s * im),
        };
    }

    /**
     * Builds the teleportation circuit on 3 qubits and 3 classical bits: prepare the message on
     * qubit 0, share a Bell pair on qubits 1 and 2, measure qubits 0 and 1 into clbits 0 and 1,
     * and correct qubit 2. With {@code readReceiver} qubit 2 is finally measured into clbit 2.
     *
     * @param theta polar angle of the message, radians, finite
     * @param phi azimuthal angle of the message, radians, finite
     * @param readReceiver whether to measure qubit 2 at the end
     * @return the circuit
     * @throws IllegalArgumentException if an angle is not finite
     */
    public static Circuit circuit(double theta, double phi, boolean readReceiver) {
        requireFinite(theta, "theta");
        requireFinite(phi, "phi");
        Circuit.Builder builder = Circuit.builder(3, 3)
                .ry(0, theta).rz(0, phi)          // Arbor's message
                .h(1).cnot(1, 2)                  // the shared pair
                .cnot(0, 1).h(0)                  // Arbor's Bell-basis rotation
                .measure(0, 0).measure(1, 1)      // the two bits on the cable
                .ifBit(1, 1, b -> b.x(2))         // Bezel's corrections
                .ifBit(0, 1, b -> b.z(2));
        if (readReceiver) {
            builder.measure(2, 2);
        }
        return builder.build();
    }

    /**
     * Teleports the message {@code rz(phi) ry(theta) |0>}, prints the checks and returns them.
     *
     * @param out where the report goes
     * @param theta polar angle of the message, radians, finite
     * @param phi azimuthal angle of the message, radians, finite
     * @param seed seed of the tally; single-shot runs use {@code seed}, {@code seed + 1}, ...
     * @param shots number of shots of the tally, from 1 to 1,000,000
     * @return the tally and the single-shot runs
     * @throws IllegalArgumentException if an angle is not finite or {@code shots} is out of range
     */
    public static Result run(PrintStream out, double theta, double phi, long seed, int shots) {
        Objects.requireNonNull(out, "out");
        Args.requireShots(shots);
        Circuit withRead = circuit(theta, phi, true);
        Circuit withoutRead = circuit(theta, phi, false);
        Complex[] message = message(theta, phi);

        Tally tally = Simulator.seeded(seed).run(withRead, shots);
        List<Branch> branches = new ArrayList<>();
        boolean[] seen = new boolean[4];
        for (int i = 0; i < BRANCH_SEEDS && branches.size() < 4; i++) {
            long s = seed + i;
            StateVector after = Simulator.seeded(s).stateAfter(withoutRead);
            Branch branch = branch(s, after, message);
            int key = branch.bit0() | branch.bit1() << 1;
            if (!seen[key]) {
                seen[key] = true;
                branches.add(branch);
            }
        }
        Result result = new Result(theta, phi, tally, branches);

        Text.title(out, "Hollin Vale optics lab: teleporting a setting from Arbor to Bezel");
        out.println(Text.f("Message on qubit 0: rz(%.4f) ry(%.4f)|0>", phi, theta));
        out.println(Text.f("  = (%s)|0> + (%s)|1>", Text.complex(message[0]),
                Text.complex(message[1])));

        Text.heading(out, "Receiver's qubit after each measurement branch (single shots)");
        out.println(Text.f("%6s  %4s  %4s  %-23s  %-23s  %s", "seed", "m0", "m1",
                "amplitude |0>", "amplitude |1>", "fidelity"));
        for (Branch b : branches) {
            out.println(Text.f("%6d  %4d  %4d  %-23s  %-23s  %.12f", b.seed(), b.bit0(),
                    b.bit1(), Text.complex(b.zero()), Text.complex(b.one()), b.fidelity()));
        }
        out.println(Text.f("Branches seen: %d of 4; worst fidelity %.12f.", branches.size(),
                result.worstFidelity()));

        Text.heading(out, Text.f("Tally of qubit 2 read at the end: %s, seed %d",
                Text.count(shots, "shot"), seed));
        double measured = (double) result.receivedOnes() / shots;
        double expected = result.expectedOne();
        double error = Math.sqrt(expected * (1 - expected) / shots);
        out.println(Text.f("  %-32s %,10d", "shots reading 1", result.receivedOnes()));
        out.println(Text.f("  %-32s %10.4f", "measured P(1)", measured));
        out.println(Text.f("  %-32s %10.4f", "expected sin^2(theta/2)", expected));
        out.println(Text.f("  %-32s %10.4f", "standard error sqrt(p(1-p)/n)", error));
        out.println(Text.f("  %-32s %10.2f", "difference in standard errors",
                error > 0 ? (measured - expected) / error : 0.0));
        return result;
    }

    /** Reads the measured bits and qubit 2's amplitudes out of a collapsed 3-qubit state. */
    private static Branch branch(long seed, StateVector after, Complex[] message) {
        double[] sent = after.marginal(0, 1);
        int key = 0;
        for (int k = 1; k < sent.length; k++) {
            if (sent[k] > sent[key]) {
                key = k;
            }
        }
        Complex zero = after.amplitude(key);
        Complex one = after.amplitude(key | 4);
        Complex overlap = message[0].conj().multiply(zero)
                .add(message[1].conj().multiply(one));
        double fidelity = overlap.getReal() * overlap.getReal()
                + overlap.getImaginary() * overlap.getImaginary();
        return new Branch(seed, key & 1, key >> 1, zero, one, fidelity);
    }

    private static void requireFinite(double value, String name) {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException(name + " must be a finite angle in radians, got "
                    + value);
        }
    }

    /**
     * Runs the example from the command line: {@code [seed [shots]]}, both optional.
     *
     * @param args optional seed and shot count
     */
    public static void main(String[] args) {
        Main.launch("teleport", args);
    }

    /** Reads {@code [seed [shots]]} and runs; used by {@link Main}. */
    static void fromArgs(String[] args, PrintStream out) {
        Args.requireAtMost(args, 2, "teleport [seed [shots]]");
        run(out, DEFAULT_THETA, DEFAULT_PHI, Args.seed(args, 0, DEFAULT_SEED),
                Args.shots(args, 1, DEFAULT_SHOTS));
    }
}
