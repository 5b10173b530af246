package dev.qsim.text;

import java.util.Collections;
import java.util.EnumSet;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Set;

import dev.qsim.Gate;
import dev.qsim.text.Syntax.GateDefinition;

/**
 * The gate names the reader knows without a definition in the program. The built-ins of
 * OpenQASM 3 are {@code U} (the catalogue's {@link Gate#U}) and {@code gphase}; the other names
 * are those of {@code stdgates.inc} (Cross et al. 2022 and the live specification at
 * openqasm.com; the file's contents are given here from memory):
 * <ul>
 *   <li>every catalogue entry with an {@linkplain Gate#qasmName() OpenQASM 3 name}: {@code p x
 *       y z h s sdg t tdg sx rx ry rz cx cy cz cp crx cry crz ch swap ccx cswap id};</li>
 *   <li>the aliases for OpenQASM 2: {@code CX} (cx), {@code phase} (p), {@code cphase} (cp),
 *       {@code u1} (p, since {@code u1(λ) = U(0, 0, λ) = diag(1, e^{iλ})});</li>
 *   <li>three gates the file defines through others, expanded from those definitions:
 *       {@code u2(φ, λ) = gphase(-(φ+λ)/2) U(π/2, φ, λ)}, {@code u3(θ, φ, λ) =
 *       gphase(-(φ+λ)/2) U(θ, φ, λ)} and {@code cu(θ, φ, λ, γ) c, t = p(γ) c; ctrl @ U(θ, φ,
 *       λ) c, t}.</li>
 * </ul>
 * Parameter and qubit counts come from the catalogue or the definition; only {@code gphase},
 * which has no catalogue entry, states its own.
 */
final class QasmGates {
    /**
     * A known gate name.
     *
     * @param name the OpenQASM name
     * @param gate the catalogue entry, or null for {@code gphase} and defined gates
     * @param parameters the number of parameters
     * @param qubits the number of qubit operands (without added controls)
     * @param standard whether the name comes from {@code stdgates.inc}, so that a program must
     *     include that file to use it; false for the built-ins
     * @param definition the definition of a gate expanded through others, or null
     */
    record Entry(String name, Gate gate, int parameters, int qubits, boolean standard,
            GateDefinition definition) {
        /** Whether this is the built-in global phase {@code gphase(γ)}. */
        boolean globalPhase() {
            return gate == null && definition == null;
        }
    }

    /** The built-in {@code gphase(γ)}: one parameter, no qubit operands. */
    private static final Entry GLOBAL_PHASE = new Entry("gphase", null, 1, 0, false, null);

    /** The definitions of stdgates.inc for the gates expanded through others. */
    private static final String DEFINED = "gate u2(φ, λ) q { gphase(-(φ + λ) / 2);"
            + " U(π / 2, φ, λ) q; }\n"
            + "gate u3(θ, φ, λ) q { gphase(-(φ + λ) / 2); U(θ, φ, λ) q; }\n"
            + "gate cu(θ, φ, λ, γ) c, t { p(γ) c; ctrl @ U(θ, φ, λ) c, t; }\n";

    /**
     * Gates whose k-th power is the gate of k times the angle, {@code g(θ)^k = g(kθ)}: those
     * of the form {@code exp(-iθG/2)} or {@code diag(1, e^{iθ})}, and their controlled forms.
     */
    private static final Set<Gate> ANGLE_POWER = Collections.unmodifiableSet(EnumSet.of(Gate.RX,
            Gate.RY, Gate.RZ, Gate.PHASE, Gate.CPHASE, Gate.CRX, Gate.CRY, Gate.CRZ, Gate.RZZ));

    private static final Map<String, Entry> BY_NAME;

    static {
        Map<String, Entry> m = new LinkedHashMap<>();
        // Every catalogue gate with an OpenQASM 3 name, then the aliases stdgates.inc defines.
        for (Gate g : Gate.values()) {
            if (g.qasmName() != null) {
                m.put(g.qasmName(), entry(g.qasmName(), g, g != Gate.U));
            }
        }
        m.put("CX", entry("CX", Gate.CNOT, true));
        m.put("phase", entry("phase", Gate.PHASE, true));
        m.put("cphase", entry("cphase", Gate.CPHASE, true));
        m.put("u1", entry("u1", Gate.PHASE, true));
        m.put(GLOBAL_PHASE.name(), GLOBAL_PHASE);
        Parser p = new Parser(new Tokens(new Lexer(DEFINED)));
        while (!p.atEnd()) {
            GateDefinition d = (GateDefinition) p.next();
            m.put(d.name(), new Entry(d.name(), null, d.parameters().size(), d.qubits().size(),
                    true, d));
        }
        BY_NAME = Collections.unmodifiableMap(m);
    }

    private QasmGates() {
    }

    private static Entry entry(String name, Gate gate, boolean standard) {
        return new Entry(name, gate, gate.parameters(), gate.qubits(), standard, null);
    }

    /**
     * Returns the entry of a name as written (case matters), whether or not the program
     * includes {@code stdgates.inc}.
     *
     * @param name the name
     * @return the entry, or null if the name is neither standard nor built in
     */
    static Entry find(String name) {
        return BY_NAME.get(name);
    }

    /**
     * Returns the entry of a name a program may call: a built-in always, a standard name only
     * when the program includes {@code stdgates.inc}.
     *
     * @param name the name
     * @param included whether the program has included {@code stdgates.inc}
     * @return the entry, or null
     */
    static Entry callable(String name, boolean included) {
        Entry e = BY_NAME.get(name);
        return e != null && (included || !e.standard()) ? e : null;
    }

    /**
     * Tells whether {@code g(θ)^k = g(kθ)} for every integer k, and for a real k when the angle
     * is within {@link #principalRange(Gate, double)}.
     */
    static boolean hasAnglePower(Gate g) {
        return ANGLE_POWER.contains(g);
    }

    /**
     * Tells whether {@code g(kθ)} is the principal power {@code g(θ)^k} for a real k: each
     * eigenvalue's phase lies in (-π, π]. For the rotations {@code exp(-iθG/2)} (eigenvalue
     * phases ±θ/2) that is |θ| &lt; 2π; for the phase gates (phases 0 and θ) -π &lt; θ ≤ π.
     */
    static boolean principalRange(Gate g, double theta) {
        if (g == Gate.PHASE || g == Gate.CPHASE) {
            return theta > -Math.PI && theta <= Math.PI;
        }
        return Math.abs(theta) < 2 * Math.PI;
    }
}
