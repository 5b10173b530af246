package dev.qsim.noise;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;

import dev.qsim.Gate;
import dev.qsim.Instruction;
import dev.qsim.internal.Bridge;
import dev.qsim.internal.Checks;

/**
 * Which channel follows which gate, and the readout error of each qubit. Immutable and
 * thread-safe; made with {@link #builder()}. The circuit itself stays ideal: a run applies,
 * after each gate, the channel this model gives for it.
 *
 * <p>The qubits of a gate are its controls followed by its targets, as in
 * {@link Instruction#controls()} and {@link Instruction#targets()}; {@code cnot(c, t)} acts
 * on {@code (c, t)}. Rules name gates by their {@link Gate} catalogue entry, or by any name
 * {@link Gate#lookup(String)} knows ({@code "cnot"}, {@code "CNOT"} and OpenQASM's {@code "cx"}
 * are the same gate); an unknown name is refused with the list of known ones. For a gate
 * {@code g} on qubits {@code Q} (a gate with added controls counts as its entry: a rule for
 * {@code rz} also follows a controlled {@code rz}), the first rule that exists wins:
 * <ol>
 * <li>a rule for gate {@code g} on exactly the qubits {@code Q};</li>
 * <li>a rule for gate {@code g} on any qubits;</li>
 * <li>a rule for any gate with {@code |Q|} qubits on exactly the qubits {@code Q};</li>
 * <li>a rule for any gate with {@code |Q|} qubits (one- and two-qubit gates);</li>
 * <li>otherwise, no noise.</li>
 * </ol>
 * A rule's channel acts on all the gate's qubits if it has as many qubits as the gate, and a
 * one-qubit channel acts on each of the gate's qubits in turn.
 *
 * <p>Readout error is the classical confusion of a measured bit: a measured 0 is reported as
 * 1 with probability {@code P(1|0)} and a measured 1 as 0 with probability {@code P(0|1)},
 * independently for every measurement (common practice; e.g. Nation et al. 2021, "Scalable
 * mitigation of measurement errors on quantum computers", PRX Quantum 2, 040326,
 * doi:10.1103/PRXQuantum.2.040326).
 *
 * <p>Waiting: a {@linkplain Instruction.Kind#DELAY delay} is ideal unless the model gives its
 * qubits relaxation times ({@link Builder#relaxationWhileIdle(double, double)}); each delayed
 * qubit then decays for the delay's duration ({@link Channel#decay(double, double, double)}).
 *
 * @since 0.1
 */
public final class NoiseModel {
    static {
        Bridge.register(new NoiseEngines());
    }

    private static final NoiseModel NONE = new Builder().build();

    private final Map<Gate, Channel> byName;
    private final Map<String, Channel> byNameOn;
    private final Map<Integer, Channel> byCount;
    private final Map<String, Channel> byCountOn;
    private final double[] readoutDefault;
    private final Map<Integer, double[]> readout;
    /** {T1, T2} in seconds while idle, for qubits without their own; null for none. */
    private final double[] idleDefault;
    private final Map<Integer, double[]> idle;

    private NoiseModel(Builder b) {
        byName = Map.copyOf(b.byName);
        byNameOn = Map.copyOf(b.byNameOn);
        byCount = Map.copyOf(b.byCount);
        byCountOn = Map.copyOf(b.byCountOn);
        readoutDefault = b.readoutDefault.clone();
        Map<Integer, double[]> r = new HashMap<>();
        for (Map.Entry<Integer, double[]> e : b.readout.entrySet()) {
            r.put(e.getKey(), e.getValue().clone());
        }
        readout = Map.copyOf(r);
        idleDefault = b.idleDefault == null ? null : b.idleDefault.clone();
        Map<Integer, double[]> w = new HashMap<>();
        for (Map.Entry<Integer, double[]> e : b.idle.entrySet()) {
            w.put(e.getKey(), e.getValue().clone());
        }
        idle = Map.copyOf(w);
    }

    /**
     * Returns the model with no noise at all.
     *
     * @return the noiseless model
     */
    public static NoiseModel none() {
        return NONE;
    }

    /**
     * Returns a builder for a model with no rules yet.
     *
     * @return a new builder
     */
    public static Builder builder() {
        return new Builder();
    }

    /** Records the rules of a noise model; mutable, not thread-safe. */
    public static final class Builder {
        private final Map<Gate, Channel> byName = new HashMap<>();
        private final Map<String, Channel> byNameOn = new HashMap<>();
        private final Map<Integer, Channel> byCount = new HashMap<>();
        private final Map<String, Channel> byCountOn = new HashMap<>();
        private double[] readoutDefault = {0, 0};
        private final Map<Integer, double[]> readout = new HashMap<>();
        private double[] idleDefault;
        private final Map<Integer, double[]> idle = new HashMap<>();

        private Builder() {
        }

        /**
         * Lets every qubit without its own times relax while it waits in a
         * {@linkplain Instruction.Kind#DELAY delay}: the channel
         * {@link Channel#decay(double, double, double) decay(duration, t1, t2)} on each
         * delayed qubit. Times are in the unit of the circuit's delays (seconds for circuits
         * read from OpenQASM).
         *
         * @param t1 the relaxation time, positive (infinity allowed)
         * @param t2 the coherence time, positive, at most {@code 2 t1}
         * @return this builder
         * @throws IllegalArgumentException if a time is out of range or {@code t2 > 2 t1}
         */
        public Builder relaxationWhileIdle(double t1, double t2) {
            Channel.decay(0, t1, t2);
            idleDefault = new double[] {t1, t2};
            return this;
        }

        /**
         * Lets one qubit relax while it waits in a delay (see
         * {@link #relaxationWhileIdle(double, double)}).
         *
         * @param qubit the qubit, at least 0
         * @param t1 the relaxation time, positive (infinity allowed)
         * @param t2 the coherence time, positive, at most {@code 2 t1}
         * @return this builder
         * @throws IllegalArgumentException if the qubit is negative, a time is out of range or
         *     {@code t2 > 2 t1}
         */
        public Builder relaxationWhileIdle(int qubit, double t1, double t2) {
            requireQubits(new int[] {qubit});
            Channel.decay(0, t1, t2);
            idle.put(qubit, new double[] {t1, t2});
            return this;
        }

        /**
         * Puts {@code channel} after every one-qubit gate (rule 4).
         *
         * @param channel a one-qubit channel
         * @return this builder
         * @throws IllegalArgumentException if the channel is not on 1 qubit
         */
        public Builder afterOneQubitGates(Channel channel) {
            byCount.put(1, fitting(channel, 1, "one-qubit gates"));
            return this;
        }

        /**
         * Puts {@code channel} after every two-qubit gate (rule 4).
         *
         * @param channel a one-qubit channel (applied to each qubit) or a two-qubit channel
         * @return this builder
         */
        public Builder afterTwoQubitGates(Channel channel) {
            byCount.put(2, fitting(channel, 2, "two-qubit gates"));
            return this;
        }

        /**
         * Puts {@code channel} after every one-qubit gate on {@code qubit} (rule 3).
         *
         * @param qubit the qubit, at least 0
         * @param channel a one-qubit channel
         * @return this builder
         * @throws IllegalArgumentException if the qubit is negative or the channel is not on
         *     1 qubit
         */
        public Builder afterOneQubitGatesOn(int qubit, Channel channel) {
            int[] qs = {qubit};
            requireQubits(qs);
            byCountOn.put(key(null, qs), fitting(channel, 1, "one-qubit gates"));
            return this;
        }

        /**
         * Puts {@code channel} after every two-qubit gate on the qubits {@code (a, b)} in this
         * order (rule 3).
         *
         * @param a the first qubit of the gate (the control of a controlled gate)
         * @param b the second qubit
         * @param channel a one-qubit or two-qubit channel
         * @return this builder
         * @throws IllegalArgumentException if a qubit is negative, they are equal, or the
         *     channel does not fit
         */
        public Builder afterTwoQubitGatesOn(int a, int b, Channel channel) {
            int[] qs = {a, b};
            requireQubits(qs);
            byCountOn.put(key(null, qs), fitting(channel, 2, "two-qubit gates"));
            return this;
        }

        /**
         * Puts {@code channel} after every instance of a catalogue gate (rule 2).
         *
         * @param gate the gate
         * @param channel a one-qubit channel, or one on as many qubits as the gate
         * @return this builder
         * @throws IllegalArgumentException if the channel fits neither
         */
        public Builder afterGate(Gate gate, Channel channel) {
            Objects.requireNonNull(gate, "gate");
            byName.put(gate, fitting(channel, gate, gate.qubits()));
            return this;
        }

        /**
         * Puts {@code channel} after every instance of the gate with this name (rule 2): a name
         * {@link Gate#lookup(String)} knows, such as {@code "h"}, {@code "cnot"}, {@code "CNOT"}
         * or OpenQASM's {@code "cx"}.
         *
         * @param gate the gate name
         * @param channel a one-qubit channel, or one on as many qubits as the gate
         * @return this builder
         * @throws IllegalArgumentException if no gate has this name (the message lists the
         *     known names) or the channel does not fit
         */
        public Builder afterGate(String gate, Channel channel) {
            return afterGate(Gate.lookup(Objects.requireNonNull(gate, "gate")), channel);
        }

        /**
         * Puts {@code channel} after every instance of a catalogue gate on exactly the given
         * qubits, controls first (rule 1).
         *
         * @param gate the gate
         * @param channel a one-qubit channel or one on {@code qubits.length} qubits
         * @param qubits the gate's qubits, distinct, at least one
         * @return this builder
         * @throws IllegalArgumentException if a qubit is negative or repeats, or the channel
         *     does not fit
         */
        public Builder afterGateOn(Gate gate, Channel channel, int... qubits) {
            Objects.requireNonNull(gate, "gate");
            Objects.requireNonNull(qubits, "qubits");
            if (qubits.length == 0) {
                throw new IllegalArgumentException("give at least one qubit of gate "
                        + gate.id());
            }
            requireQubits(qubits);
            byNameOn.put(key(gate, qubits), fitting(channel, qubits.length, "gate "
                    + gate.id()));
            return this;
        }

        /**
         * Puts {@code channel} after every instance of the gate with this name on exactly the
         * given qubits, controls first (rule 1); names as for
         * {@link #afterGate(String, Channel)}.
         *
         * @param gate the gate name
         * @param channel a one-qubit channel or one on {@code qubits.length} qubits
         * @param qubits the gate's qubits, distinct, at least one
         * @return this builder
         * @throws IllegalArgumentException if no gate has this name, a qubit is negative or
         *     repeats, or the channel does not fit
         */
        public Builder afterGateOn(String gate, Channel channel, int... qubits) {
            return afterGateOn(Gate.lookup(Objects.requireNonNull(gate, "gate")), channel,
                    qubits);
        }

        /**
         * Sets the readout error of every qubit without its own.
         *
         * @param p1given0 the probability {@code P(1|0)} of reading 1 when 0 was measured
         * @param p0given1 the probability {@code P(0|1)} of reading 0 when 1 was measured
         * @return this builder
         * @throws IllegalArgumentException if a probability is outside [0, 1]
         */
        public Builder readoutError(double p1given0, double p0given1) {
            readoutDefault = new double[] {Checks.requireProbability(p1given0,
                    "readout error P(1|0)"),
                Checks.requireProbability(p0given1, "readout error P(0|1)")};
            return this;
        }

        /**
         * Sets the readout error of one qubit.
         *
         * @param qubit the qubit, at least 0
         * @param p1given0 the probability {@code P(1|0)}
         * @param p0given1 the probability {@code P(0|1)}
         * @return this builder
         * @throws IllegalArgumentException if the qubit is negative or a probability is outside
         *     [0, 1]
         */
        public Builder readoutError(int qubit, double p1given0, double p0given1) {
            requireQubits(new int[] {qubit});
            readout.put(qubit, new double[] {
                Checks.requireProbability(p1given0, "readout error P(1|0) of qubit " + qubit),
                Checks.requireProbability(p0given1, "readout error P(0|1) of qubit " + qubit)});
            return this;
        }

        /**
         * Returns the model.
         *
         * @return the immutable model
         */
        public NoiseModel build() {
            return new NoiseModel(this);
        }

        private static Channel fitting(Channel channel, Gate gate, int gateQubits) {
            Objects.requireNonNull(channel, "channel");
            if (gate == Gate.UNITARY || channel.qubits() == 1) {
                return channel;
            }
            return fitting(channel, gateQubits, "gate " + gate.id());
        }

        private static Channel fitting(Channel channel, int gateQubits, String what) {
            Objects.requireNonNull(channel, "channel");
            if (channel.qubits() != 1 && channel.qubits() != gateQubits) {
                throw new IllegalArgumentException("a " + channel.qubits()
                        + "-qubit channel cannot follow " + what + " on " + gateQubits
                        + " qubit(s); use a 1-qubit or " + gateQubits + "-qubit channel");
            }
            return channel;
        }

        private static void requireQubits(int[] qs) {
            for (int i = 0; i < qs.length; i++) {
                if (qs[i] < 0) {
                    throw new IllegalArgumentException("qubit " + qs[i]
                            + " is negative; qubits are at least 0");
                }
                for (int j = 0; j < i; j++) {
                    if (qs[i] == qs[j]) {
                        throw new IllegalArgumentException("qubit " + qs[i]
                                + " is given twice; the qubits must be distinct");
                    }
                }
            }
        }
    }

    private static String key(Gate gate, int[] qubits) {
        return (gate == null ? "" : gate.name()) + Arrays.toString(qubits);
    }

    /**
     * Returns the channel this model puts after a gate, or {@code null} for none.
     *
     * @param gate a gate instruction
     * @return the channel of the first matching rule, or {@code null}
     * @throws IllegalArgumentException if the instruction is not a gate
     */
    public Channel channelAfter(Instruction gate) {
        Objects.requireNonNull(gate, "gate");
        if (gate.kind() != Instruction.Kind.GATE) {
            throw new IllegalArgumentException("noise follows gates, not '" + gate.name() + "'");
        }
        int[] qs = gate.qubits();
        Channel c = byNameOn.get(key(gate.gate(), qs));
        if (c == null) {
            c = byName.get(gate.gate());
        }
        if (c == null) {
            c = byCountOn.get(key(null, qs));
        }
        if (c == null) {
            c = byCount.get(qs.length);
        }
        return c;
    }

    /**
     * Returns the channels to apply after a gate with the qubits each acts on; empty for no
     * noise or the identity channel.
     */
    List<Placed> noiseAfter(Instruction gate) {
        Channel c = channelAfter(gate);
        List<Placed> out = new ArrayList<>();
        if (c == null || c.isIdentity()) {
            return out;
        }
        int[] qs = gate.qubits();
        if (c.qubits() == qs.length) {
            out.add(new Placed(c, qs));
        } else if (c.qubits() == 1) {
            for (int q : qs) {
                out.add(new Placed(c, new int[] {q}));
            }
        } else {
            throw new IllegalArgumentException("the " + c.qubits() + "-qubit channel for gate '"
                    + gate.name() + "' cannot follow it on " + qs.length + " qubit(s) "
                    + Arrays.toString(qs));
        }
        return out;
    }

    /** A channel and the qubits it acts on. */
    record Placed(Channel channel, int[] qubits) {
    }

    /**
     * Returns the relaxation of each waiting qubit during a delay; empty if no qubit of the
     * delay has relaxation times or the delay lasts no time.
     */
    List<Placed> noiseDuring(Instruction delay) {
        List<Placed> out = new ArrayList<>();
        double duration = delay.duration();
        if (!(duration > 0)) {
            return out;
        }
        for (int q : delay.targets()) {
            double[] times = idle.getOrDefault(q, idleDefault);
            if (times != null) {
                Channel c = Channel.decay(duration, times[0], times[1]);
                if (!c.isIdentity()) {
                    out.add(new Placed(c, new int[] {q}));
                }
            }
        }
        return out;
    }

    /**
     * Tells whether this model adds no noise: no gate rule with a channel other than the
     * identity, no readout error, and no finite relaxation time while idle.
     *
     * @return whether runs under this model are ideal
     */
    public boolean isIdeal() {
        for (Channel c : byName.values()) {
            if (!c.isIdentity()) {
                return false;
            }
        }
        for (Channel c : byNameOn.values()) {
            if (!c.isIdentity()) {
                return false;
            }
        }
        for (Channel c : byCount.values()) {
            if (!c.isIdentity()) {
                return false;
            }
        }
        for (Channel c : byCountOn.values()) {
            if (!c.isIdentity()) {
                return false;
            }
        }
        if (readoutDefault[0] != 0 || readoutDefault[1] != 0) {
            return false;
        }
        for (double[] r : readout.values()) {
            if (r[0] != 0 || r[1] != 0) {
                return false;
            }
        }
        return !relaxes(idleDefault) && idle.values().stream().noneMatch(NoiseModel::relaxes);
    }

    /** Whether idle times describe any decay: a finite T1 or T2. */
    private static boolean relaxes(double[] times) {
        return times != null && (Double.isFinite(times[0]) || Double.isFinite(times[1]));
    }

    /**
     * Returns the readout error {@code P(1|0)} of a qubit.
     *
     * @param qubit the qubit, at least 0
     * @return the probability of reading 1 when 0 was measured
     */
    public double readoutP1Given0(int qubit) {
        double[] r = readout.get(qubit);
        return r == null ? readoutDefault[0] : r[0];
    }

    /**
     * Returns the readout error {@code P(0|1)} of a qubit.
     *
     * @param qubit the qubit, at least 0
     * @return the probability of reading 0 when 1 was measured
     */
    public double readoutP0Given1(int qubit) {
        double[] r = readout.get(qubit);
        return r == null ? readoutDefault[1] : r[1];
    }

    /**
     * Describes the model by its number of rules.
     *
     * @return a short description
     */
    @Override
    public String toString() {
        return "NoiseModel[" + (byName.size() + byNameOn.size() + byCount.size()
                + byCountOn.size()) + " gate rule(s), " + readout.size()
                + " per-qubit readout error(s)" + (idleDefault != null || !idle.isEmpty()
                ? ", relaxation while idle" : "") + "]";
    }
}
