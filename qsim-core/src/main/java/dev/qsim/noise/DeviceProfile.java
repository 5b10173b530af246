package dev.qsim.noise;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.EnumMap;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.Set;

import dev.qsim.Circuit;
import dev.qsim.Gate;
import dev.qsim.Instruction;
import dev.qsim.internal.Checks;
import dev.qsim.internal.Json;
import dev.qsim.internal.TextFiles;

/**
 * A description of a quantum device, read from a device-profile file: its qubits, which pairs
 * of them can interact, their relaxation and dephasing times, gate durations, average gate
 * errors and readout errors. It checks that a circuit fits the device
 * ({@link #requireCouplings(Circuit)}) and builds the {@link NoiseModel} that the numbers
 * imply ({@link #noiseModel()}). Immutable and thread-safe.
 *
 * <h2>The file</h2>
 *
 * <p>A device profile is one JSON object (RFC 8259, read strictly: no comments, no trailing
 * commas, no repeated names) in UTF-8, at most {@value #MAX_CHARS} bytes, for example:
 * <pre>{@code
 * {
 *   "format": "qsim device profile",
 *   "version": 1,
 *   "name": "Example pair",
 *   "note": "invented numbers",
 *   "qubitCount": 2,
 *   "durationsNs": {"oneQubitGate": 30, "twoQubitGate": 250, "measurement": 1000},
 *   "averageGateErrors": {"oneQubitGate": 0.0005, "twoQubitGate": 0.01},
 *   "gates": {"rz": {"durationNs": 0, "error": 0}},
 *   "qubits": [
 *     {"qubit": 0, "relaxationTimeNs": 80000, "dephasingTimeNs": 60000,
 *      "readoutP1Given0": 0.01, "readoutP0Given1": 0.02},
 *     {"qubit": 1, "relaxationTimeNs": 95000, "dephasingTimeNs": 40000,
 *      "oneQubitGateError": 0.0008, "readoutP1Given0": 0.015, "readoutP0Given1": 0.03}
 *   ],
 *   "couplings": [{"pair": [0, 1], "twoQubitGateError": 0.012}]
 * }
 * }</pre>
 * The fields, all required unless marked optional; times in nanoseconds, errors and
 * probabilities as numbers in [0, 1]:
 * <ul>
 * <li>{@code format}: the string {@value #FORMAT}; {@code version}: the whole number
 *     {@value #VERSION};</li>
 * <li>{@code name}: the device's name, not blank, at most {@value #MAX_NAME} characters;
 *     {@code note} (optional): any text;</li>
 * <li>{@code qubitCount}: from 1 to {@value #MAX_QUBITS};</li>
 * <li>{@code durationsNs}: {@code oneQubitGate}, {@code twoQubitGate} and {@code measurement},
 *     each finite and at least 0;</li>
 * <li>{@code averageGateErrors}: {@code oneQubitGate} in [0, 1/2] and {@code twoQubitGate} in
 *     [0, 3/4]: the average gate infidelity {@code 1 - F_avg}, the figure randomized
 *     benchmarking reports (Magesan, Gambetta and Emerson 2011, "Scalable and robust
 *     randomized benchmarking of quantum processes", Phys. Rev. Lett. 106, 180504,
 *     doi:10.1103/PhysRevLett.106.180504). The bounds {@code 1 - 1/d} are the error of a gate
 *     that leaves the completely mixed state;</li>
 * <li>{@code gates} (optional): entries for single gates, each named as
 *     {@link Gate#lookup(String)} knows it ({@code "rz"}, {@code "cx"}, {@code "CNOT"}) and
 *     acting on one or two qubits, each with a {@code durationNs}, an {@code error} or both;
 *     they replace the defaults for that gate;</li>
 * <li>{@code qubits}: one object per qubit in order, with {@code qubit} (its index, as a
 *     check), {@code relaxationTimeNs} (T1) and {@code dephasingTimeNs} (T2), positive and
 *     finite with {@code T2 <= 2 T1}, {@code readoutP1Given0} and {@code readoutP0Given1} (the
 *     probabilities of reading 1 when the qubit was 0, and 0 when it was 1), and optionally its
 *     own {@code oneQubitGateError} in [0, 1/2];</li>
 * <li>{@code couplings}: the pairs of qubits a two-qubit gate may act on, either way round,
 *     each an object with {@code pair} (two different qubit indices) and optionally its own
 *     {@code twoQubitGateError} in [0, 3/4]; a pair may appear once. It may be empty.</li>
 * </ul>
 * The error of a gate on given qubits is the gate's entry in {@code gates} if it has an
 * error, else the qubit's or pair's own, else the one of {@code averageGateErrors}; its
 * duration is the gate's entry if it has one, else the one of {@code durationsNs}.
 *
 * <p>Version rule: the reader reads version {@value #VERSION} only and refuses every field it
 * does not know, naming it, so a misspelt field is caught and nothing is ignored silently. Any
 * change to the format (a field added or removed, a meaning or unit changed) gives it a new
 * version number; a file of another version is refused with both numbers in the message.
 *
 * <h2>The noise model</h2>
 *
 * <p>After each gate of duration {@code t} with average error {@code r} on {@code k} qubits
 * ({@code d = 2^k}), {@link #noiseModel()} puts one channel: first each qubit's relaxation and
 * dephasing for the time {@code t} ({@link Channel#decay(double, double, double)} with its T1
 * and T2; for two qubits their tensor product), then depolarizing
 * ({@link Channel#depolarizing(double)} or {@link Channel#twoQubitDepolarizing(double)}) with
 * the probability {@code p} that makes the average gate fidelity of the whole channel exactly
 * {@code 1 - r}. The numbers, derived in {@code docs/device-profile.md}:
 * <ul>
 * <li>average gate fidelity and entanglement fidelity of a channel with Kraus operators
 *     {@code K_i}: {@code F_avg = (d F_e + 1) / (d + 1)} with
 *     {@code F_e = sum_i |tr K_i|^2 / d^2} (Horodecki, Horodecki and Horodecki 1999, Phys. Rev.
 *     A 60, 1888, doi:10.1103/PhysRevA.60.1888; Nielsen 2002, "A simple formula for the
 *     average gate fidelity of a quantum dynamical operation", Phys. Lett. A 303, 249,
 *     doi:10.1016/S0375-9601(02)01272-0; Nielsen and Chuang 2010, §9.3);</li>
 * <li>for the decay of one qubit, {@code F_e = (1 + 2 exp(-t/T2) + exp(-t/T1)) / 4} (from the
 *     Kraus operators of amplitude and phase damping, Nielsen and Chuang 2010, §8.3.5-8.3.6);
 *     for two qubits the product of theirs;</li>
 * <li>depolarizing with Pauli-error probability {@code p} is
 *     {@code (1 - q) rho + q I/d} with {@code q = p d^2 / (d^2 - 1)} (Nielsen and Chuang 2010,
 *     §8.3.4), and {@code F_e} is linear in the channel, so after the decay
 *     {@code F_e = (1 - q) F_e(decay) + q / d^2}. Solving for the target
 *     {@code F_e = 1 - r (d + 1) / d} gives
 *     {@code q = (F_e(decay) - F_e) / (F_e(decay) - 1/d^2)}, clamped at 0 when the decay alone
 *     already has the stated error or more (then the model's error is the decay's).</li>
 * </ul>
 * Readout errors are set per qubit ({@link NoiseModel.Builder#readoutError(int, double,
 * double)}). The measurement duration is recorded but adds no decay: the stated readout errors
 * are the measured confusion and already include it. A qubit waiting in a delay decays with
 * its own T1 and T2 for the delay's duration, in seconds
 * ({@link NoiseModel.Builder#relaxationWhileIdle(int, double, double)}); a qubit idle while
 * others run gates does not (noise follows instructions, on their qubits), and gates on pairs
 * without a coupling or on three or more qubits get no noise: check circuits with
 * {@link #requireCouplings(Circuit)} first.
 *
 * @since 0.1
 */
public final class DeviceProfile {
    /** The value of the {@code format} field. */
    public static final String FORMAT = "qsim device profile";

    /** The format version this reader reads. */
    public static final int VERSION = 1;

    /** The most qubits a profile may describe. */
    public static final int MAX_QUBITS = 4096;

    /** The longest name, in characters. */
    public static final int MAX_NAME = 200;

    /** The longest profile text, in characters (a file: bytes), checked before reading. */
    public static final int MAX_CHARS = 1 << 23;

    private static final long MAX_VALUES = 1 << 21;

    private static final Set<String> TOP = Set.of("format", "version", "name", "note",
            "qubitCount", "durationsNs", "averageGateErrors", "gates", "qubits", "couplings");
    private static final Set<String> DURATIONS = Set.of("oneQubitGate", "twoQubitGate",
            "measurement");
    private static final Set<String> ERRORS = Set.of("oneQubitGate", "twoQubitGate");
    private static final Set<String> GATE = Set.of("durationNs", "error");
    private static final Set<String> QUBIT = Set.of("qubit", "relaxationTimeNs",
            "dephasingTimeNs", "oneQubitGateError", "readoutP1Given0", "readoutP0Given1");
    private static final Set<String> COUPLING = Set.of("pair", "twoQubitGateError");

    /**
     * Two qubits a two-qubit gate may act on, either way round; {@code first < second}.
     *
     * @param first the lower qubit index
     * @param second the higher qubit index
     * @since 0.1
     */
    public record Coupling(int first, int second) {
        /**
         * Checks the order.
         *
         * @param first the lower qubit index, at least 0
         * @param second the higher qubit index
         * @throws IllegalArgumentException if {@code first < 0} or {@code first >= second}
         */
        public Coupling {
            if (first < 0 || first >= second) {
                throw new IllegalArgumentException("a coupling takes two qubits, the lower first,"
                        + " but got (" + first + ", " + second + ")");
            }
        }

        /**
         * Returns the coupling of two different qubits in either order.
         *
         * @param a one qubit, at least 0
         * @param b the other qubit, at least 0, not {@code a}
         * @return the coupling with the lower index first
         * @throws IllegalArgumentException if a qubit is negative or they are equal
         */
        public static Coupling of(int a, int b) {
            return new Coupling(Math.min(a, b), Math.max(a, b));
        }

        /**
         * Writes the pair as {@code first-second}, such as {@code 0-1}.
         *
         * @return the text
         */
        @Override
        public String toString() {
            return first + "-" + second;
        }
    }

    private final String name;
    private final String note;
    private final int qubitCount;
    private final double oneQubitDuration;
    private final double twoQubitDuration;
    private final double measurementDuration;
    private final double oneQubitError;
    private final double twoQubitError;
    /** Per gate: {duration or NaN, error or NaN}. */
    private final Map<Gate, double[]> gates;
    private final double[] t1;
    private final double[] t2;
    private final double[] qubitError;
    private final double[] p1Given0;
    private final double[] p0Given1;
    private final List<Coupling> couplings;
    /** Per coupling: its own two-qubit error, or NaN. */
    private final Map<Coupling, Double> pairError;
    private volatile NoiseModel model;

    private DeviceProfile(Json.ObjectValue root) {
        Json.Value format = root.require("format", "format");
        if (!(format instanceof Json.StringValue s) || !s.text().equals(FORMAT)) {
            throw format.error("format must be the string \"" + FORMAT + "\" but is "
                    + format.describe() + "; this file is not a qsim device profile");
        }
        Json.Value version = root.require("version", "version");
        if (!isWhole(version, VERSION)) {
            throw version.error("version must be " + VERSION + " but is " + version.describe()
                    + "; this qsim reads version " + VERSION + " of the device-profile format"
                    + " only");
        }
        root.requireOnly(TOP, "the profile");

        name = root.require("name", "name").asString("name");
        if (name.isBlank() || name.length() > MAX_NAME) {
            throw root.get("name").error("name must be a text of 1 to " + MAX_NAME
                    + " characters, not blank, but is \"" + TextFiles.shown(name) + "\" ("
                    + name.length() + " characters)");
        }
        Json.Value n = root.get("note");
        note = n == null ? "" : n.asString("note");
        qubitCount = (int) root.require("qubitCount", "qubitCount").asLong("qubitCount", 1,
                MAX_QUBITS);

        Json.ObjectValue durations = root.require("durationsNs", "durationsNs")
                .asObject("durationsNs");
        durations.requireOnly(DURATIONS, "durationsNs");
        oneQubitDuration = duration(durations, "oneQubitGate", "durationsNs.oneQubitGate");
        twoQubitDuration = duration(durations, "twoQubitGate", "durationsNs.twoQubitGate");
        measurementDuration = duration(durations, "measurement", "durationsNs.measurement");

        Json.ObjectValue errors = root.require("averageGateErrors", "averageGateErrors")
                .asObject("averageGateErrors");
        errors.requireOnly(ERRORS, "averageGateErrors");
        oneQubitError = error(errors.require("oneQubitGate", "averageGateErrors.oneQubitGate"),
                1, "averageGateErrors.oneQubitGate");
        twoQubitError = error(errors.require("twoQubitGate", "averageGateErrors.twoQubitGate"),
                2, "averageGateErrors.twoQubitGate");

        gates = readGates(root.get("gates"));

        t1 = new double[qubitCount];
        t2 = new double[qubitCount];
        qubitError = new double[qubitCount];
        p1Given0 = new double[qubitCount];
        p0Given1 = new double[qubitCount];
        readQubits(root.require("qubits", "qubits").asArray("qubits"));

        couplings = new ArrayList<>();
        pairError = new HashMap<>();
        readCouplings(root.require("couplings", "couplings").asArray("couplings"));
    }

    /** Whether a value is the given whole number. */
    private static boolean isWhole(Json.Value v, long expected) {
        try {
            return v.asLong("a number") == expected;
        } catch (IllegalArgumentException e) {
            return false;
        }
    }

    private static double duration(Json.ObjectValue o, String field, String path) {
        Json.Value v = o.require(field, path);
        double t = v.asDouble(path);
        if (!(t >= 0)) {
            throw v.error(path + " must be at least 0 (nanoseconds) but is " + v.describe());
        }
        return t;
    }

    private static double error(Json.Value v, int qubits, String path) {
        double r = v.asDouble(path);
        double max = qubits == 1 ? 0.5 : 0.75;
        if (!(r >= 0 && r <= max)) {
            throw v.error(path + " must be in [0, " + max + "] but is " + v.describe() + "; "
                    + max + " is the average error of a " + (qubits == 1 ? "one" : "two")
                    + "-qubit gate that leaves the completely mixed state");
        }
        return r;
    }

    private static double probability(Json.Value v, String path) {
        double p = v.asDouble(path);
        if (!(p >= 0 && p <= 1)) {
            throw v.error(path + " must be a probability in [0, 1] but is " + v.describe());
        }
        return p;
    }

    private static Map<Gate, double[]> readGates(Json.Value value) {
        Map<Gate, double[]> out = new EnumMap<>(Gate.class);
        if (value == null) {
            return out;
        }
        Json.ObjectValue o = value.asObject("gates");
        Map<Gate, String> spelled = new EnumMap<>(Gate.class);
        int index = 0;
        for (Map.Entry<String, Json.Value> e : o.members().entrySet()) {
            String key = e.getKey();
            String at = o.nameAt(index++);
            Optional<Gate> found = Gate.find(key);
            if (found.isEmpty()) {
                throw new IllegalArgumentException(at + ": unknown gate \"" + TextFiles.shown(key)
                        + "\" in gates; known gates: " + Gate.knownNames());
            }
            Gate g = found.get();
            if (g.qubits() != 1 && g.qubits() != 2) {
                throw new IllegalArgumentException(at + ": gates." + TextFiles.shown(key)
                        + ": a profile describes gates on one or two qubits, but " + g.id()
                        + (g.qubits() == 0 ? " has no fixed qubit count" : " acts on "
                        + g.qubits()));
            }
            if (spelled.containsKey(g)) {
                throw new IllegalArgumentException(at + ": gates: \"" + TextFiles.shown(key)
                        + "\" and \"" + TextFiles.shown(spelled.get(g)) + "\" name the same gate, "
                        + g.id() + "; give it once");
            }
            spelled.put(g, key);
            String path = "gates." + TextFiles.shown(key);
            Json.ObjectValue entry = e.getValue().asObject(path);
            entry.requireOnly(GATE, path);
            if (entry.members().isEmpty()) {
                throw entry.error(path + " must give durationNs, error or both");
            }
            Json.Value d = entry.get("durationNs");
            Json.Value r = entry.get("error");
            out.put(g, new double[] {
                d == null ? Double.NaN : duration(entry, "durationNs", path + ".durationNs"),
                r == null ? Double.NaN : error(r, g.qubits(), path + ".error")});
        }
        return out;
    }

    private void readQubits(Json.ArrayValue list) {
        if (list.items().size() != qubitCount) {
            throw list.error("qubits must hold one entry per qubit, " + qubitCount + " (from"
                    + " qubitCount), but holds " + list.items().size());
        }
        for (int q = 0; q < qubitCount; q++) {
            String path = "qubits[" + q + "]";
            Json.ObjectValue o = list.items().get(q).asObject(path);
            o.requireOnly(QUBIT, path);
            Json.Value index = o.require("qubit", path + ".qubit");
            if (!isWhole(index, q)) {
                throw index.error(path + ".qubit must be " + q + " (the entries are in qubit"
                        + " order) but is " + index.describe());
            }
            Json.Value v1 = o.require("relaxationTimeNs", path + ".relaxationTimeNs");
            Json.Value v2 = o.require("dephasingTimeNs", path + ".dephasingTimeNs");
            t1[q] = v1.asDouble(path + ".relaxationTimeNs");
            t2[q] = v2.asDouble(path + ".dephasingTimeNs");
            if (!(t1[q] > 0)) {
                throw v1.error(path + ".relaxationTimeNs (T1) must be positive (nanoseconds) but"
                        + " is " + v1.describe());
            }
            if (!(t2[q] > 0)) {
                throw v2.error(path + ".dephasingTimeNs (T2) must be positive (nanoseconds) but"
                        + " is " + v2.describe());
            }
            if (t2[q] > 2 * t1[q]) {
                throw v2.error(path + ".dephasingTimeNs (T2) is " + v2.describe()
                        + ", more than twice relaxationTimeNs (T1) " + v1.describe()
                        + "; a qubit has T2 <= 2 T1");
            }
            Json.Value e = o.get("oneQubitGateError");
            qubitError[q] = e == null ? Double.NaN : error(e, 1, path + ".oneQubitGateError");
            p1Given0[q] = probability(o.require("readoutP1Given0", path + ".readoutP1Given0"),
                    path + ".readoutP1Given0");
            p0Given1[q] = probability(o.require("readoutP0Given1", path + ".readoutP0Given1"),
                    path + ".readoutP0Given1");
        }
    }

    private void readCouplings(Json.ArrayValue list) {
        Map<Coupling, String> seen = new HashMap<>();
        for (int i = 0; i < list.items().size(); i++) {
            String path = "couplings[" + i + "]";
            Json.ObjectValue o = list.items().get(i).asObject(path);
            o.requireOnly(COUPLING, path);
            Json.Value pairValue = o.require("pair", path + ".pair");
            List<Json.Value> pair = pairValue.asArray(path + ".pair").items();
            if (pair.size() != 2) {
                throw pairValue.error(path + ".pair must hold two qubit indices but holds "
                        + pair.size());
            }
            int a = (int) pair.get(0).asLong(path + ".pair[0]", 0, qubitCount - 1);
            int b = (int) pair.get(1).asLong(path + ".pair[1]", 0, qubitCount - 1);
            if (a == b) {
                throw pairValue.error(path + ".pair couples qubit " + a + " with itself; give"
                        + " two different qubits");
            }
            Coupling c = Coupling.of(a, b);
            String earlier = seen.put(c, path);
            if (earlier != null) {
                throw pairValue.error(path + ".pair: qubits " + c.first() + " and " + c.second()
                        + " are already coupled by " + earlier + "; give each pair once");
            }
            couplings.add(c);
            Json.Value e = o.get("twoQubitGateError");
            pairError.put(c, e == null ? Double.NaN : error(e, 2, path + ".twoQubitGateError"));
        }
    }

    // ------------------------------------------------------------------ reading

    /**
     * Reads a device profile from JSON text.
     *
     * @param text the text
     * @return the profile
     * @throws IllegalArgumentException if the text is longer than {@value #MAX_CHARS}
     *     characters, is not JSON, or breaks a rule of the format; the message gives the line
     *     and column and names the field
     */
    public static DeviceProfile read(String text) {
        Objects.requireNonNull(text, "text");
        return new DeviceProfile(Json.parse(text, MAX_CHARS, MAX_VALUES).asObject("a device"
                + " profile"));
    }

    /**
     * Reads a device profile from a UTF-8 file.
     *
     * @param file the file
     * @return the profile
     * @throws IOException if the file cannot be read
     * @throws IllegalArgumentException if the file is larger than {@value #MAX_CHARS} bytes
     *     (checked before reading), is not UTF-8, or is not a valid profile; the message starts
     *     with the file name
     */
    public static DeviceProfile read(Path file) throws IOException {
        Objects.requireNonNull(file, "file");
        try {
            return read(TextFiles.readUtf8(file, MAX_CHARS, "the device profile"));
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException(file + ": " + e.getMessage(), e);
        }
    }

    // ------------------------------------------------------------------ accessors

    /**
     * Returns the device's name.
     *
     * @return the name
     */
    public String name() {
        return name;
    }

    /**
     * Returns the note, or an empty string if the file has none.
     *
     * @return the note
     */
    public String note() {
        return note;
    }

    /**
     * Returns the number of qubits.
     *
     * @return the qubit count
     */
    public int qubitCount() {
        return qubitCount;
    }

    /**
     * Returns the couplings in the order of the file.
     *
     * @return an unmodifiable list
     */
    public List<Coupling> couplings() {
        return Collections.unmodifiableList(couplings);
    }

    /**
     * Tells whether a two-qubit gate may act on two qubits, in either order.
     *
     * @param a one qubit
     * @param b the other qubit
     * @return whether the device couples them (false for equal or out-of-range qubits)
     */
    public boolean canCouple(int a, int b) {
        return a != b && a >= 0 && b >= 0 && pairError.containsKey(Coupling.of(a, b));
    }

    /**
     * Returns a qubit's relaxation time T1.
     *
     * @param qubit the qubit
     * @return T1 in nanoseconds
     * @throws IndexOutOfBoundsException if the qubit is out of range
     */
    public double relaxationTimeNs(int qubit) {
        Checks.requireQubit(qubit, qubitCount);
        return t1[qubit];
    }

    /**
     * Returns a qubit's dephasing time T2.
     *
     * @param qubit the qubit
     * @return T2 in nanoseconds
     * @throws IndexOutOfBoundsException if the qubit is out of range
     */
    public double dephasingTimeNs(int qubit) {
        Checks.requireQubit(qubit, qubitCount);
        return t2[qubit];
    }

    /**
     * Returns the probability of reading 1 when a qubit was 0.
     *
     * @param qubit the qubit
     * @return {@code P(1|0)}
     * @throws IndexOutOfBoundsException if the qubit is out of range
     */
    public double readoutP1Given0(int qubit) {
        Checks.requireQubit(qubit, qubitCount);
        return p1Given0[qubit];
    }

    /**
     * Returns the probability of reading 0 when a qubit was 1.
     *
     * @param qubit the qubit
     * @return {@code P(0|1)}
     * @throws IndexOutOfBoundsException if the qubit is out of range
     */
    public double readoutP0Given1(int qubit) {
        Checks.requireQubit(qubit, qubitCount);
        return p0Given1[qubit];
    }

    /**
     * Returns the duration of a measurement.
     *
     * @return the duration in nanoseconds
     */
    public double measurementDurationNs() {
        return measurementDuration;
    }

    /**
     * Returns the duration of a gate: its own entry's, else the default for its qubit count.
     *
     * @param gate a gate on one or two qubits
     * @return the duration in nanoseconds
     * @throws IllegalArgumentException if the gate acts on another number of qubits
     */
    public double durationNs(Gate gate) {
        int k = gateQubits(gate);
        double[] own = gates.get(gate);
        if (own != null && !Double.isNaN(own[0])) {
            return own[0];
        }
        return k == 1 ? oneQubitDuration : twoQubitDuration;
    }

    /**
     * Returns the average error of a gate on given qubits (controls first): the gate's own
     * entry's if it has one, else the qubit's or pair's own, else the default for its qubit
     * count.
     *
     * @param gate a gate on one or two qubits
     * @param qubits its qubits, in range; two must be coupled
     * @return the average gate error {@code 1 - F_avg}
     * @throws IllegalArgumentException if the gate acts on another number of qubits than given,
     *     or two qubits are not coupled
     * @throws IndexOutOfBoundsException if a qubit is out of range
     */
    public double gateError(Gate gate, int... qubits) {
        int k = gateQubits(gate);
        Objects.requireNonNull(qubits, "qubits");
        if (qubits.length != k) {
            throw new IllegalArgumentException(gate.id() + " acts on " + k + " qubit(s) but "
                    + qubits.length + " were given");
        }
        Checks.requireDistinctQubits(qubits, qubitCount, "the qubits of " + gate.id());
        if (k == 2 && !canCouple(qubits[0], qubits[1])) {
            throw new IllegalArgumentException("qubits " + qubits[0] + " and " + qubits[1]
                    + " are not coupled on device " + Checks.excerpt(name));
        }
        double[] own = gates.get(gate);
        if (own != null && !Double.isNaN(own[1])) {
            return own[1];
        }
        return k == 1 ? qubitError(qubits[0]) : pairError(Coupling.of(qubits[0], qubits[1]));
    }

    private double qubitError(int q) {
        return Double.isNaN(qubitError[q]) ? oneQubitError : qubitError[q];
    }

    private double pairError(Coupling c) {
        double e = pairError.get(c);
        return Double.isNaN(e) ? twoQubitError : e;
    }

    private static int gateQubits(Gate gate) {
        Objects.requireNonNull(gate, "gate");
        int k = gate.qubits();
        if (k != 1 && k != 2) {
            throw new IllegalArgumentException("a device profile describes gates on one or two"
                    + " qubits, but " + gate.id() + (k == 0 ? " has no fixed qubit count"
                    : " acts on " + k));
        }
        return k;
    }

    // ------------------------------------------------------------------ circuits

    /**
     * Checks that a circuit fits the device: at most {@link #qubitCount()} qubits, every gate
     * on one or two qubits, and every two-qubit gate (controls count as qubits) on a coupled
     * pair, inside conditioned blocks too. Changes nothing.
     *
     * @param circuit the circuit
     * @return the circuit, for chaining
     * @throws IllegalArgumentException naming the first instruction (by index, and by step
     *     inside a conditioned block) that does not fit, its qubits and the couplings
     */
    public Circuit requireCouplings(Circuit circuit) {
        Objects.requireNonNull(circuit, "circuit");
        if (circuit.qubits() > qubitCount) {
            throw new IllegalArgumentException("the circuit has " + circuit.qubits()
                    + " qubits but device " + Checks.excerpt(name) + " has " + qubitCount
                    + " (qubits 0 to " + (qubitCount - 1) + ")");
        }
        List<Instruction> list = circuit.instructions();
        for (int i = 0; i < list.size(); i++) {
            requireFits(list.get(i), "instruction " + i);
        }
        return circuit;
    }

    private void requireFits(Instruction in, String where) {
        if (in.kind() == Instruction.Kind.IF_BIT) {
            List<Instruction> body = in.body();
            for (int j = 0; j < body.size(); j++) {
                requireFits(body.get(j), where + " (a block if clbit " + in.clbit() + " is "
                        + in.value() + "), its step " + j);
            }
            return;
        }
        if (in.kind() != Instruction.Kind.GATE) {
            return;
        }
        int[] q = in.qubits();
        String what = where + " (" + in.name() + " on qubits " + join(q) + ")";
        if (q.length > 2) {
            throw new IllegalArgumentException(what + " acts on " + q.length + " qubits; device "
                    + Checks.excerpt(name) + " runs gates on one or two qubits, so decompose it"
                    + " first");
        }
        if (q.length == 2 && !canCouple(q[0], q[1])) {
            StringBuilder all = new StringBuilder();
            for (Coupling c : couplings) {
                all.append(all.length() == 0 ? "" : ", ").append(c);
            }
            throw new IllegalArgumentException(what + " needs a coupling between qubits " + q[0]
                    + " and " + q[1] + ", which device " + Checks.excerpt(name)
                    + " does not have; its couplings: " + (all.length() == 0 ? "none"
                    : Checks.excerpt(all.toString())));
        }
    }

    private static String join(int[] q) {
        StringBuilder sb = new StringBuilder();
        for (int x : q) {
            sb.append(sb.length() == 0 ? "" : ", ").append(x);
        }
        return sb.toString();
    }

    // ------------------------------------------------------------------ noise

    /**
     * Returns the noise model the profile implies (see the class description): after each
     * one-qubit gate on any qubit and each two-qubit gate on a coupled pair, relaxation and
     * dephasing for the gate's duration, then depolarizing up to the stated average gate
     * error; relaxation of delayed qubits; readout errors per qubit. Built once.
     *
     * @return the noise model
     */
    public NoiseModel noiseModel() {
        NoiseModel m = model;
        if (m == null) {
            m = buildModel();
            model = m;
        }
        return m;
    }

    private NoiseModel buildModel() {
        NoiseModel.Builder b = NoiseModel.builder();
        for (int q = 0; q < qubitCount; q++) {
            b.readoutError(q, p1Given0[q], p0Given1[q]);
            // Delays are in seconds (OpenQASM durations); the profile's times in nanoseconds.
            b.relaxationWhileIdle(q, t1[q] * 1e-9, t2[q] * 1e-9);
            b.afterOneQubitGatesOn(q, oneQubitChannel(q, oneQubitDuration, qubitError(q)));
            for (Gate g : gates.keySet()) {
                if (g.qubits() == 1) {
                    b.afterGateOn(g, oneQubitChannel(q, durationNs(g), gateError(g, q)), q);
                }
            }
        }
        for (Coupling c : couplings) {
            int[][] orders = {{c.first(), c.second()}, {c.second(), c.first()}};
            for (int[] o : orders) {
                b.afterTwoQubitGatesOn(o[0], o[1], twoQubitChannel(o[0], o[1],
                        twoQubitDuration, pairError(c)));
                for (Gate g : gates.keySet()) {
                    if (g.qubits() == 2) {
                        b.afterGateOn(g, twoQubitChannel(o[0], o[1], durationNs(g),
                                gateError(g, o[0], o[1])), o[0], o[1]);
                    }
                }
            }
        }
        return b.build();
    }

    /** Entanglement fidelity of Channel.decay(t, T1, T2): (1 + 2 e^{-t/T2} + e^{-t/T1}) / 4. */
    static double decayEntanglementFidelity(double t, double relaxation, double dephasing) {
        return (1 + 2 * Math.exp(-t / dephasing) + Math.exp(-t / relaxation)) / 4;
    }

    /**
     * The Pauli-error probability p of depolarizing on dimension d that, after a channel of
     * entanglement fidelity fe, gives the average gate error r; 0 if fe alone reaches r.
     */
    static double depolarizingFor(double fe, int d, double r) {
        double target = 1 - r * (d + 1) / d;
        if (!(fe > target)) {
            return 0;
        }
        double q = (fe - target) / (fe - 1.0 / (d * d));
        return Math.min(1, q * (d * d - 1) / (d * d));
    }

    private Channel oneQubitChannel(int q, double t, double r) {
        Channel decay = Channel.decay(t, t1[q], t2[q]);
        double p = depolarizingFor(decayEntanglementFidelity(t, t1[q], t2[q]), 2, r);
        return p == 0 ? decay : decay.then(Channel.depolarizing(p));
    }

    /** The channel after a gate on (a, b): bit 0 of its matrices is a, bit 1 is b. */
    private Channel twoQubitChannel(int a, int b, double t, double r) {
        Channel decay = Channel.decay(t, t1[b], t2[b]).tensor(Channel.decay(t, t1[a], t2[a]));
        double fe = decayEntanglementFidelity(t, t1[a], t2[a])
                * decayEntanglementFidelity(t, t1[b], t2[b]);
        double p = depolarizingFor(fe, 4, r);
        return p == 0 ? decay : decay.then(Channel.twoQubitDepolarizing(p));
    }

    /**
     * Describes the profile by its name, qubit count and coupling count.
     *
     * @return a short description
     */
    @Override
    public String toString() {
        return "DeviceProfile[" + Checks.excerpt(name) + ", " + qubitCount + " qubit(s), "
                + couplings.size() + " coupling(s)]";
    }
}
