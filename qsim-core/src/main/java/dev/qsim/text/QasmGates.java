package dev.qsim.text;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;

import dev.qsim.Gate;

/**
 * The gate names the reader knows without a definition in the program, read from the
 * {@linkplain Gate catalogue}: every entry with an {@linkplain Gate#qasmName() OpenQASM 3 name}
 * of {@code stdgates.inc}, the aliases that file defines ({@code CX}, {@code phase},
 * {@code cphase}), and the language's built-ins {@code U} (the catalogue's {@link Gate#U}) and
 * {@code gphase}. Parameter and qubit counts come from the catalogue; only {@code gphase}, which
 * has no catalogue entry, states its own.
 */
final class QasmGates {
    /**
     * A known gate name.
     *
     * @param name the OpenQASM name
     * @param gate the catalogue entry, or null for {@code gphase}
     * @param parameters the number of parameters
     * @param qubits the number of qubit operands (without added controls)
     * @param standard whether the name comes from {@code stdgates.inc}, so that a program must
     *     include that file to use it; false for the built-ins
     */
    record Entry(String name, Gate gate, int parameters, int qubits, boolean standard) {
        /** Whether this is the built-in global phase {@code gphase(γ)}. */
        boolean globalPhase() {
            return gate == null;
        }
    }

    /** The built-in {@code gphase(γ)}: one parameter, no qubit operands. */
    private static final Entry GLOBAL_PHASE = new Entry("gphase", null, 1, 0, false);

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
        m.put(GLOBAL_PHASE.name(), GLOBAL_PHASE);
        BY_NAME = Collections.unmodifiableMap(m);
    }

    private QasmGates() {
    }

    private static Entry entry(String name, Gate gate, boolean standard) {
        return new Entry(name, gate, gate.parameters(), gate.qubits(), standard);
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
}
