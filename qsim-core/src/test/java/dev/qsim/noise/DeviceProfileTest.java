package dev.qsim.noise;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.regex.Pattern;

import org.apache.commons.numbers.complex.Complex;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import dev.qsim.Circuit;
import dev.qsim.Gate;
import dev.qsim.Instruction;
import dev.qsim.Operator;
import dev.qsim.Simulator;
import dev.qsim.Tally;
import dev.qsim.stats.TallyComparison;

/**
 * Device profiles: the format (our own, documented in DeviceProfile and
 * docs/device-profile.md), and the noise model's numbers against published formulas computed
 * here by hand.
 */
class DeviceProfileTest {
    /** A three-qubit line, 0-1 and 1-2; numbers chosen for the test, not a real device. */
    private static final String LINE = "{\n"
            + "  \"format\": \"qsim device profile\",\n"
            + "  \"version\": 1,\n"
            + "  \"name\": \"test line\",\n"
            + "  \"note\": \"three qubits\",\n"
            + "  \"qubitCount\": 3,\n"
            + "  \"durationsNs\": {\"oneQubitGate\": 40, \"twoQubitGate\": 300,"
            + " \"measurement\": 1000},\n"
            + "  \"averageGateErrors\": {\"oneQubitGate\": 0.002, \"twoQubitGate\": 0.02},\n"
            + "  \"gates\": {\"rz\": {\"durationNs\": 0, \"error\": 0}, \"cz\": {\"durationNs\":"
            + " 200}},\n"
            + "  \"qubits\": [\n"
            + "    {\"qubit\": 0, \"relaxationTimeNs\": 50000, \"dephasingTimeNs\": 30000,"
            + " \"readoutP1Given0\": 0.01, \"readoutP0Given1\": 0.02},\n"
            + "    {\"qubit\": 1, \"relaxationTimeNs\": 20000, \"dephasingTimeNs\": 35000,"
            + " \"oneQubitGateError\": 0.004, \"readoutP1Given0\": 0.03, \"readoutP0Given1\":"
            + " 0.05},\n"
            + "    {\"qubit\": 2, \"relaxationTimeNs\": 80000, \"dephasingTimeNs\": 100000,"
            + " \"readoutP1Given0\": 0.02, \"readoutP0Given1\": 0.04}\n"
            + "  ],\n"
            + "  \"couplings\": [{\"pair\": [0, 1]}, {\"pair\": [2, 1], \"twoQubitGateError\":"
            + " 0.03}]\n"
            + "}\n";

    private static final Pattern PLACE = Pattern.compile("^line \\d+, column \\d+: ");

    private static String with(String from, String to) {
        int at = LINE.indexOf(from);
        assertTrue(at >= 0 && LINE.indexOf(from, at + 1) < 0, "the test's edit must match once: "
                + from);
        return LINE.replace(from, to);
    }

    /** A one-qubit profile: gate time t, T1, T2, a one-qubit error. */
    private static DeviceProfile single(double t, double t1, double t2, double error) {
        return DeviceProfile.read("{\"format\": \"qsim device profile\", \"version\": 1,"
                + " \"name\": \"one\", \"qubitCount\": 1, \"durationsNs\": {\"oneQubitGate\": "
                + t + ", \"twoQubitGate\": 0, \"measurement\": 0}, \"averageGateErrors\":"
                + " {\"oneQubitGate\": " + error + ", \"twoQubitGate\": 0}, \"qubits\":"
                + " [{\"qubit\": 0, \"relaxationTimeNs\": " + t1 + ", \"dephasingTimeNs\": "
                + t2 + ", \"readoutP1Given0\": 0, \"readoutP0Given1\": 0}], \"couplings\": []}");
    }

    private static Instruction first(Circuit c) {
        return c.instructions().get(0);
    }

    /**
     * Average gate fidelity of a channel against the identity, from its Kraus operators:
     * F_e = sum_i |tr K_i|^2 / d^2 and F_avg = (d F_e + 1) / (d + 1) (Nielsen 2002, Phys. Lett.
     * A 303, 249; Horodecki et al. 1999, Phys. Rev. A 60, 1888).
     */
    private static double averageFidelity(Channel channel) {
        int d = 1 << channel.qubits();
        double fe = 0;
        for (Operator k : channel.kraus()) {
            Complex tr = Complex.ZERO;
            for (int i = 0; i < d; i++) {
                tr = tr.add(k.get(i, i));
            }
            fe += tr.abs() * tr.abs();
        }
        fe /= d * d;
        return (d * fe + 1) / (d + 1);
    }

    // ------------------------------------------------------------------ reading

    @Test
    void aValidProfileIsReadFieldByField() {
        // The format of docs/device-profile.md; the expected values are the text's own.
        DeviceProfile p = DeviceProfile.read(LINE);
        assertEquals("test line", p.name());
        assertEquals("three qubits", p.note());
        assertEquals(3, p.qubitCount());
        assertEquals(List.of(new DeviceProfile.Coupling(0, 1), new DeviceProfile.Coupling(1, 2)),
                p.couplings());
        assertTrue(p.canCouple(1, 0) && p.canCouple(1, 2) && p.canCouple(2, 1));
        assertFalse(p.canCouple(0, 2) || p.canCouple(1, 1) || p.canCouple(0, 7));
        assertEquals(20000, p.relaxationTimeNs(1));
        assertEquals(100000, p.dephasingTimeNs(2));
        assertEquals(0.03, p.readoutP1Given0(1));
        assertEquals(0.04, p.readoutP0Given1(2));
        assertEquals(1000, p.measurementDurationNs());
        assertEquals(40, p.durationNs(Gate.H));
        assertEquals(0, p.durationNs(Gate.RZ));
        assertEquals(200, p.durationNs(Gate.CZ));
        assertEquals(300, p.durationNs(Gate.CNOT));
        // Precedence: the gate's own error, else the qubit's or pair's, else the default.
        assertEquals(0.002, p.gateError(Gate.H, 0));
        assertEquals(0.004, p.gateError(Gate.H, 1));
        assertEquals(0.0, p.gateError(Gate.RZ, 1));
        assertEquals(0.02, p.gateError(Gate.CZ, 1, 0));
        assertEquals(0.03, p.gateError(Gate.CNOT, 1, 2));
        assertEquals(0.03, p.gateError(Gate.CZ, 2, 1));
        assertEquals("DeviceProfile[test line, 3 qubit(s), 2 coupling(s)]", p.toString());
        assertEquals("", DeviceProfile.read(with("  \"note\": \"three qubits\",\n", "")).note());
    }

    @Test
    void accessorsRefuseBadArguments() {
        // DEVELOPERS.md: an index out of range is an IndexOutOfBoundsException naming it.
        DeviceProfile p = DeviceProfile.read(LINE);
        assertThrows(IndexOutOfBoundsException.class, () -> p.relaxationTimeNs(3));
        IllegalArgumentException pair = assertThrows(IllegalArgumentException.class,
                () -> p.gateError(Gate.CNOT, 0, 2));
        assertEquals("qubits 0 and 2 are not coupled on device test line", pair.getMessage());
        IllegalArgumentException three = assertThrows(IllegalArgumentException.class,
                () -> p.durationNs(Gate.TOFFOLI));
        assertTrue(three.getMessage().contains("toffoli acts on 3"), three.getMessage());
        assertThrows(IllegalArgumentException.class, () -> p.gateError(Gate.H, 0, 1));
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', quoteCharacter = '`', value = {
        // the edit (from => to) | a part of the message
        "\"format\": \"qsim device profile\"|\"format\": \"qsim profile\"|format must be the"
            + " string \"qsim device profile\" but is the string \"qsim profile\"",
        "\"format\": \"qsim device profile\",|\"formats\": 1,|format is missing",
        "\"version\": 1|\"version\": 2|version must be 1 but is the number 2",
        "\"version\": 1|\"version\": \"1\"|version must be 1 but is the string \"1\"",
        "\"version\": 1|\"version\": 1.5|version must be 1 but is the number 1.5",
        "\"note\": \"three qubits\"|\"notes\": \"three qubits\"|unknown field \"notes\" in the"
            + " profile",
        "\"name\": \"test line\"|\"name\": \"  \"|name must be a text of 1 to 200 characters",
        "\"name\": \"test line\"|\"name\": 7|name must be a string but is the number 7",
        "\"qubitCount\": 3|\"qubitCount\": 0|qubitCount must be a whole number from 1 to 4096"
            + " but is 0",
        "\"qubitCount\": 3|\"qubitCount\": 2|qubits must hold one entry per qubit, 2",
        "\"oneQubitGate\": 40|\"oneQubitGate\": -40|durationsNs.oneQubitGate must be at least 0",
        "\"measurement\": 1000|\"readout\": 1000|unknown field \"readout\" in durationsNs",
        ", \"measurement\": 1000||durationsNs.measurement is missing",
        "\"oneQubitGate\": 0.002|\"oneQubitGate\": 0.6|averageGateErrors.oneQubitGate must be in"
            + " [0, 0.5] but is the number 0.6",
        "\"twoQubitGate\": 0.02|\"twoQubitGate\": -0.02|averageGateErrors.twoQubitGate must be in"
            + " [0, 0.75]",
        "\"rz\": {|\"rzz2\": {|unknown gate \"rzz2\" in gates; known gates: i (id), h",
        "\"rz\": {|\"toffoli\": {|a profile describes gates on one or two qubits, but toffoli"
            + " acts on 3",
        "\"rz\": {|\"unitary\": {|unitary has no fixed qubit count",
        "\"cz\": {\"durationNs\": 200}|\"cz\": {}|gates.cz must give durationNs, error or both",
        "\"cz\": {\"durationNs\": 200}|\"cz\": {\"duration\": 200}|unknown field \"duration\" in"
            + " gates.cz",
        "\"cz\": {\"durationNs\": 200}|\"cz\": {\"durationNs\": 200}, \"CZ\": {\"error\": 0.1}"
            + "|\"CZ\" and \"cz\" name the same gate, cz",
        "\"error\": 0}|\"error\": 0.7}|gates.rz.error must be in [0, 0.5]",
        "{\"qubit\": 1,|{\"qubit\": 0,|qubits[1].qubit must be 1 (the entries are in qubit order)"
            + " but is the number 0",
        "\"relaxationTimeNs\": 50000|\"relaxationTimeNs\": 0|qubits[0].relaxationTimeNs (T1)"
            + " must be positive",
        "\"dephasingTimeNs\": 30000|\"dephasingTimeNs\": -3|qubits[0].dephasingTimeNs (T2) must"
            + " be positive",
        "\"dephasingTimeNs\": 35000|\"dephasingTimeNs\": 40001|qubits[1].dephasingTimeNs (T2) is"
            + " the number 40001, more than twice relaxationTimeNs (T1) the number 20000",
        "\"readoutP1Given0\": 0.01|\"readoutP1Given0\": 1.5|qubits[0].readoutP1Given0 must be a"
            + " probability in [0, 1] but is the number 1.5",
        "\"readoutP1Given0\": 0.01, ||qubits[0].readoutP1Given0 is missing",
        "\"oneQubitGateError\": 0.004|\"oneQubitGateError\": 0.51|qubits[1].oneQubitGateError"
            + " must be in [0, 0.5]",
        "\"oneQubitGateError\": 0.004|\"T1\": 0.004|unknown field \"T1\" in qubits[1]; allowed:"
            + " dephasingTimeNs, oneQubitGateError, qubit, readoutP0Given1, readoutP1Given0,"
            + " relaxationTimeNs",
        "{\"pair\": [0, 1]}|{\"pair\": [0, 3]}|couplings[0].pair[1] must be a whole number from"
            + " 0 to 2 but is 3",
        "{\"pair\": [0, 1]}|{\"pair\": [1, 1]}|couplings[0].pair couples qubit 1 with itself",
        "{\"pair\": [0, 1]}|{\"pair\": [0]}|couplings[0].pair must hold two qubit indices but"
            + " holds 1",
        "{\"pair\": [0, 1]}|{\"pair\": [1, 2]}|couplings[1].pair: qubits 1 and 2 are already"
            + " coupled by couplings[0]",
        "{\"pair\": [0, 1]}|[0, 1]|couplings[0] must be an object but is an array",
        "\"twoQubitGateError\": 0.03|\"twoQubitGateError\": 0.8|couplings[1].twoQubitGateError"
            + " must be in [0, 0.75]",
        "\"couplings\": [|\"coupling\": [|unknown field \"coupling\" in the profile",
    })
    void everyBadFieldIsRefusedWithItsNameAndPlace(String from, String to, String shown) {
        String text = with(from, to == null ? "" : to);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> DeviceProfile.read(text));
        assertTrue(PLACE.matcher(e.getMessage()).find(), e.getMessage());
        assertTrue(e.getMessage().contains(shown), e.getMessage());
    }

    @Test
    void theVersionIsCheckedBeforeUnknownFields() {
        // Version rule of docs/device-profile.md: a file of another version is refused by its
        // version, not by the fields that version may add.
        String text = with("\"version\": 1", "\"version\": 2, \"pulseShapes\": []");
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> DeviceProfile.read(text));
        assertEquals("line 3, column 14: version must be 1 but is the number 2; this qsim reads"
                + " version 1 of the device-profile format only", e.getMessage());
    }

    @Test
    void syntaxAndShapeErrorsAreRefused() {
        // RFC 8259 syntax, through the strict reader.
        assertTrue(assertThrows(IllegalArgumentException.class, () -> DeviceProfile.read(
                with("\"measurement\": 1000", "\"measurement\": NaN"))).getMessage()
                .contains("unknown word 'NaN'"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> DeviceProfile.read(
                "[1]")).getMessage().contains("a device profile must be an object but is an"
                + " array"));
    }

    @Test
    void filesAreReadWithTheirNameInMessages(@TempDir Path dir) throws IOException {
        // A byte-order mark at the start is ignored (RFC 8259 §8.1).
        Path good = dir.resolve("line.json");
        Files.writeString(good, "\uFEFF" + LINE, StandardCharsets.UTF_8);
        assertEquals("test line", DeviceProfile.read(good).name());
        Path bad = dir.resolve("bad.json");
        Files.writeString(bad, with("\"qubitCount\": 3", "\"qubitCount\": -3"));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> DeviceProfile.read(bad));
        assertTrue(e.getMessage().startsWith(bad + ": line 6, column 17: qubitCount"),
                e.getMessage());
    }

    // ------------------------------------------------------------------ the noise model

    @Test
    void theExcitedPopulationDecaysAsExpMinusTOverT1AndCoherenceAsExpMinusTOverT2() {
        // Amplitude and phase damping over a gate of duration t (Nielsen and Chuang 2010,
        // §8.3.5-8.3.6; Krantz et al. 2019, Appl. Phys. Rev. 6, 021318): after X,
        // rho_11 = exp(-t/T1); after H, rho_01 = exp(-t/T2) / 2 and rho_11 = exp(-t/T1) / 2.
        // A stated error of 0 is below the decay's, so no depolarizing is added.
        double t = 1000;
        double t1 = 20000;
        double t2 = 15000;
        Simulator sim = Simulator.seeded(5).withNoise(single(t, t1, t2, 0).noiseModel());
        DensityMatrix x = sim.densityMatrixAfter(Circuit.builder(1).x(0).build());
        assertEquals(Math.exp(-t / t1), x.get(1, 1).getReal(), 1e-12);
        assertEquals(1 - Math.exp(-t / t1), x.get(0, 0).getReal(), 1e-12);
        DensityMatrix h = sim.densityMatrixAfter(Circuit.builder(1).h(0).build());
        assertEquals(Math.exp(-t / t2) / 2, h.get(0, 1).abs(), 1e-12);
        assertEquals(Math.exp(-t / t1) / 2, h.get(1, 1).getReal(), 1e-12);
        // A delay of d seconds (OpenQASM's unit) decays with the profile's times in ns.
        double d = 3e-6;
        DensityMatrix waited = sim.densityMatrixAfter(Circuit.builder(1).x(0).delay(d, 0)
                .build());
        assertEquals(Math.exp(-t / t1) * Math.exp(-d * 1e9 / t1), waited.get(1, 1).getReal(),
                1e-12);
    }

    @Test
    void theAverageGateFidelityOfEveryChannelIsOneMinusTheStatedError() {
        // F_avg from the channel's Kraus operators by Nielsen 2002's formula (averageFidelity
        // above); the stated errors are those of LINE with its precedence rule.
        NoiseModel m = DeviceProfile.read(LINE).noiseModel();
        Object[][] cases = {
            {Circuit.builder(3).h(0).build(), 0.002},
            {Circuit.builder(3).sqrtX(2).build(), 0.002},
            {Circuit.builder(3).h(1).build(), 0.004},
            {Circuit.builder(3).cnot(0, 1).build(), 0.02},
            {Circuit.builder(3).cnot(1, 0).build(), 0.02},
            {Circuit.builder(3).cz(1, 0).build(), 0.02},
            {Circuit.builder(3).cnot(1, 2).build(), 0.03},
            {Circuit.builder(3).swap(2, 1).build(), 0.03},
            {Circuit.builder(3).cz(2, 1).build(), 0.03},
            {Circuit.builder(3).controlled(Gate.RZ, new double[] {0.3}, new int[] {2}, 1)
                .build(), 0.03},
        };
        for (Object[] c : cases) {
            Instruction in = first((Circuit) c[0]);
            Channel ch = m.channelAfter(in);
            assertEquals(1 - (double) c[1], averageFidelity(ch), 1e-12, in::toString);
            assertEquals(in.qubits().length, ch.qubits(), in::toString);
        }
        Channel rz = m.channelAfter(first(Circuit.builder(3).rz(1, 0.4).build()));
        assertTrue(rz.isIdentity(), "rz: duration 0 and error 0 give the identity channel");
    }

    @Test
    void whenDecayAloneExceedsTheStatedErrorNoDepolarizingIsAdded() {
        // One qubit: F_avg of the decay is (3 + exp(-t/T1) + 2 exp(-t/T2)) / 6 (docs/
        // device-profile.md, from F_e = (1 + 2 exp(-t/T2) + exp(-t/T1)) / 4 and Nielsen 2002);
        // here 1 - F_avg is about 0.042, above the stated 0.01.
        double t = 2000;
        double t1 = 30000;
        double t2 = 25000;
        Channel c = single(t, t1, t2, 0.01).noiseModel().channelAfter(
                first(Circuit.builder(1).x(0).build()));
        double decay = (3 + Math.exp(-t / t1) + 2 * Math.exp(-t / t2)) / 6;
        assertEquals(decay, averageFidelity(c), 1e-12);
        assertTrue(1 - decay > 0.01);
        assertEquals(averageFidelity(Channel.decay(t, t1, t2)), averageFidelity(c), 1e-15);
    }

    @Test
    void depolarizingMakesUpTheRestOfTheStatedError() {
        // For a range of times and errors, the built channel's F_avg (Nielsen 2002 on its
        // Kraus operators) is 1 - r whenever r is above the decay's own error.
        double[][] cases = {
            {0, 1e5, 1e5, 0.001}, {30, 1e5, 2e5, 0.0005}, {50, 7e4, 3e4, 0.01},
            {25, 1e4, 1e4, 0.4}, {100, 5e4, 5e4, 0.5}, {0, 1, 2, 0.5},
        };
        for (double[] k : cases) {
            Channel c = single(k[0], k[1], k[2], k[3]).noiseModel().channelAfter(
                    first(Circuit.builder(1).h(0).build()));
            assertEquals(1 - k[3], averageFidelity(c), 1e-12, () -> java.util.Arrays.toString(k));
        }
    }

    @Test
    void twoQubitDecayActsOnEachQubitWithItsOwnTimes() {
        // After X on qubit 0 and a two-qubit gate of duration t, qubit 0's excited population
        // is exp(-t/T1(0)) whichever way round the gate's qubits are given (Nielsen and Chuang
        // 2010, §8.3.5). Gate errors 0 (below the decay's) and one-qubit gates of duration 0.
        String text = LINE.replace("\"oneQubitGate\": 40", "\"oneQubitGate\": 0")
                .replace("\"oneQubitGate\": 0.002", "\"oneQubitGate\": 0")
                .replace("\"oneQubitGateError\": 0.004", "\"oneQubitGateError\": 0")
                .replace("\"twoQubitGate\": 0.02", "\"twoQubitGate\": 0");
        Simulator sim = Simulator.seeded(3).withNoise(DeviceProfile.read(text).noiseModel());
        double t = 300;
        for (boolean flip : new boolean[] {false, true}) {
            Circuit.Builder b = Circuit.builder(2).x(0);
            Circuit c = (flip ? b.cnot(1, 0) : b.cnot(0, 1)).build();
            double[] p = sim.densityMatrixAfter(c).probabilities();
            double q0 = p[1] + p[3];
            assertEquals(Math.exp(-t / 50000), q0, 1e-12, "flip " + flip);
        }
    }

    @Test
    void readoutErrorsAndGatesWithoutACouplingFollowTheProfile() {
        // Documented in DeviceProfile: readout per qubit; no rule for uncoupled pairs or
        // three-qubit gates.
        DeviceProfile p = DeviceProfile.read(LINE);
        NoiseModel m = p.noiseModel();
        assertSame(m, p.noiseModel(), "built once");
        for (int q = 0; q < 3; q++) {
            assertEquals(p.readoutP1Given0(q), m.readoutP1Given0(q));
            assertEquals(p.readoutP0Given1(q), m.readoutP0Given1(q));
        }
        assertNull(m.channelAfter(first(Circuit.builder(3).cnot(0, 2).build())));
        assertNull(m.channelAfter(first(Circuit.builder(3).toffoli(0, 1, 2).build())));
        assertFalse(m.isIdeal());
    }

    // ------------------------------------------------------------------ couplings

    @Test
    void aCircuitOnAnUncoupledPairIsRefusedByInstructionAndPair() {
        // Rule of DeviceProfile.requireCouplings.
        DeviceProfile p = DeviceProfile.read(LINE);
        Circuit ok = Circuit.builder(3).h(0).cnot(0, 1).cz(2, 1).rz(2, 0.1).measure().build();
        assertSame(ok, p.requireCouplings(ok));
        Circuit far = Circuit.builder(3).h(0).cnot(0, 1).cnot(0, 2).build();
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> p.requireCouplings(far));
        assertEquals("instruction 2 (cnot on qubits 0, 2) needs a coupling between qubits 0 and"
                + " 2, which device test line does not have; its couplings: 0-1, 1-2",
                e.getMessage());
        Circuit controlled = Circuit.builder(3).controlled(Gate.RY, new double[] {0.2},
                new int[] {2}, 0).build();
        assertTrue(assertThrows(IllegalArgumentException.class, () -> p.requireCouplings(
                controlled)).getMessage().startsWith("instruction 0 (cry on qubits 2, 0) needs a"
                + " coupling between qubits 2 and 0"));
        Circuit three = Circuit.builder(3).toffoli(0, 1, 2).build();
        assertEquals("instruction 0 (toffoli on qubits 0, 1, 2) acts on 3 qubits; device test"
                + " line runs gates on one or two qubits, so decompose it first",
                assertThrows(IllegalArgumentException.class, () -> p.requireCouplings(three))
                        .getMessage());
        Circuit wide = Circuit.builder(4).h(3).build();
        assertEquals("the circuit has 4 qubits but device test line has 3 (qubits 0 to 2)",
                assertThrows(IllegalArgumentException.class, () -> p.requireCouplings(wide))
                        .getMessage());
        Circuit nested = Circuit.builder(3, 1).measure(0, 0).ifBit(0, 1, b -> b.x(1).cz(2, 0))
                .build();
        assertEquals("instruction 1 (a block if clbit 0 is 1), its step 1 (cz on qubits 2, 0)"
                + " needs a coupling between qubits 2 and 0, which device test line does not"
                + " have; its couplings: 0-1, 1-2", assertThrows(IllegalArgumentException.class,
                        () -> p.requireCouplings(nested)).getMessage());
    }

    @Test
    void aCircuitRunsUnderTheProfilesNoise() {
        // The facade with the profile's model. Readout error alone, independent per qubit
        // (NoiseModel javadoc), gives the all-zero and one-flip probabilities by hand; the
        // density-matrix and trajectory engines' tallies agree with the exact distribution
        // by Pearson's chi-square (TallyComparison; seeded, so the verdict is fixed).
        DeviceProfile p = DeviceProfile.read(LINE);
        Simulator noisy = Simulator.seeded(1).withNoise(p.noiseModel());
        double[] readout = noisy.distribution(p.requireCouplings(Circuit.builder(3).measure()
                .build()));
        assertEquals((1 - 0.01) * (1 - 0.03) * (1 - 0.02), readout[0], 1e-12);
        assertEquals(0.01 * (1 - 0.03) * (1 - 0.02), readout[1], 1e-12);
        assertEquals((1 - 0.01) * 0.03 * 0.02, readout[6], 1e-12);

        Circuit ghz = p.requireCouplings(Circuit.builder(3).h(0).cnot(0, 1).cnot(1, 2)
                .measure().build());
        double[] exact = noisy.distribution(ghz);
        assertTrue(exact[1] + exact[2] + exact[4] > 0.01, "the noise leaves the GHZ outcomes");
        for (Simulator.Engine engine : new Simulator.Engine[] {Simulator.Engine.DENSITY_MATRIX,
            Simulator.Engine.TRAJECTORIES}) {
            Tally t = Simulator.seeded(11).withEngine(engine).withNoise(p.noiseModel())
                    .run(ghz, 4000);
            double pValue = TallyComparison.of(t, exact).chiSquarePValue();
            assertTrue(pValue > 1e-4, engine + ": p = " + pValue);
        }
    }
}
