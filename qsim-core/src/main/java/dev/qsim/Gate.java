package dev.qsim;

import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.function.Function;

import dev.qsim.internal.Checks;

/**
 * The catalogue of gates: one entry per gate, holding every fact that qsim's builders, engines,
 * readers, writers, drawings and noise rules need about it. A gate's identity is its entry; no
 * part of qsim tells gates apart by name strings. Adding a gate is one entry here plus its tests.
 *
 * <p>Each entry knows:
 * <ul>
 *   <li>its {@linkplain #id() identifier} (the builder method that records it, {@code "cnot"}),
 *       its {@linkplain #qasmName() OpenQASM 3 name} ({@code "cx"}) and its drawing
 *       {@linkplain #targetLabels(double[], int) labels};</li>
 *   <li>its shape: {@linkplain #controls() built-in controls}, {@linkplain #targets() target
 *       qubits} and {@linkplain #parameters() angle count}; a gate given on qubits
 *       {@code (q0, q1, ...)} takes its controls first, then its targets (the
 *       {@linkplain dev.qsim package conventions}: {@link #CNOT} on (control, target));</li>
 *   <li>its {@linkplain #operator(double...) matrix} on the targets (the textbook matrices of
 *       {@link Gates}: Nielsen and Chuang 2010, §4.2-4.3), its
 *       {@linkplain #inverse() inverse} and {@linkplain #inverseAngles(double...) inverse
 *       angles}, and its {@linkplain #shape() kernel shape};</li>
 *   <li>whether it is a Clifford gate for given angles ({@code rz(π/2)} is, {@code rz(0.3)} is
 *       not), and its {@linkplain #cliffordSteps(double...) decomposition} into the stabilizer
 *       engine's primitive gates.</li>
 * </ul>
 *
 * <p>{@link #UNITARY} stands for any unitary given as a matrix ({@link Circuit.Builder#apply}).
 * Any gate may carry further controls ({@link Circuit.Builder#controlled(Gate, double[], int[],
 * int...)}); a controlled form that has an entry of its own ({@code X} with one control is
 * {@link #CNOT}) is recorded as that entry ({@link #withControls(int)}).
 *
 * <p>Names: {@link #lookup(String)} finds an entry by its constant name, its identifier or
 * its OpenQASM 3 name, ignoring case and underscores ({@code "CNOT"}, {@code "cnot"},
 * {@code "cx"} and {@code "CX"} are all {@link #CNOT}).
 *
 * @since 0.1
 */
public enum Gate {
    /** The identity; OpenQASM {@code id}. */
    I("i", 0, 1, 0, Shape.DIAGONAL, "id", null, a -> Gates.I, CliffordSteps.NONE, "I"),
    /** Hadamard. */
    H("h", 0, 1, 0, Shape.DENSE, "h", null, a -> Gates.H, CliffordSteps.one(CliffordSteps.H), "H"),
    /** Pauli X (NOT). */
    X("x", 0, 1, 0, Shape.PERMUTATION, "x", null, a -> Gates.X,
            CliffordSteps.one(CliffordSteps.X), "X"),
    /** Pauli Y. */
    Y("y", 0, 1, 0, Shape.PERMUTATION, "y", null, a -> Gates.Y,
            CliffordSteps.one(CliffordSteps.Y), "Y"),
    /** Pauli Z. */
    Z("z", 0, 1, 0, Shape.DIAGONAL, "z", null, a -> Gates.Z, CliffordSteps.one(CliffordSteps.Z),
            "Z"),
    /** {@code S = diag(1, i)}. */
    S("s", 0, 1, 0, Shape.DIAGONAL, "s", "sDagger", a -> Gates.S,
            CliffordSteps.one(CliffordSteps.S), "S"),
    /** {@code S† = diag(1, -i)}; OpenQASM {@code sdg}. */
    S_DAGGER("sDagger", 0, 1, 0, Shape.DIAGONAL, "sdg", "s", a -> Gates.S_DAGGER,
            CliffordSteps.one(CliffordSteps.S_DAGGER), "S+"),
    /** {@code T = diag(1, e^{iπ/4})}. */
    T("t", 0, 1, 0, Shape.DIAGONAL, "t", "tDagger", a -> Gates.T, null, "T"),
    /** {@code T† = diag(1, e^{-iπ/4})}; OpenQASM {@code tdg}. */
    T_DAGGER("tDagger", 0, 1, 0, Shape.DIAGONAL, "tdg", "t", a -> Gates.T_DAGGER, null, "T+"),
    /** Square root of X, {@link Gates#SQRT_X}; OpenQASM {@code sx}. */
    SQRT_X("sqrtX", 0, 1, 0, Shape.DENSE, "sx", "sqrtXDagger", a -> Gates.SQRT_X,
            CliffordSteps.fixed(CliffordSteps.H, 0, CliffordSteps.S, 0, CliffordSteps.H, 0), "SX"),
    /** Inverse of {@link #SQRT_X}; written to OpenQASM as {@code inv @ sx}. */
    SQRT_X_DAGGER("sqrtXDagger", 0, 1, 0, Shape.DENSE, null, "sqrtX",
            a -> Gates.SQRT_X_DAGGER, CliffordSteps.fixed(CliffordSteps.H, 0,
                    CliffordSteps.S_DAGGER, 0, CliffordSteps.H, 0),
            "SX+"),
    /** {@code rx(θ) = exp(-iθX/2)}. */
    RX("rx", 0, 1, 1, Shape.DENSE, "rx", "rx", a -> Gates.rx(a[0]), CliffordSteps::rx, "RX"),
    /** {@code ry(θ) = exp(-iθY/2)}. */
    RY("ry", 0, 1, 1, Shape.DENSE, "ry", "ry", a -> Gates.ry(a[0]), CliffordSteps::ry, "RY"),
    /** {@code rz(θ) = exp(-iθZ/2)}. */
    RZ("rz", 0, 1, 1, Shape.DIAGONAL, "rz", "rz", a -> Gates.rz(a[0]), CliffordSteps::rz, "RZ"),
    /** {@code phase(λ) = diag(1, e^{iλ})}; OpenQASM {@code p}. */
    PHASE("phase", 0, 1, 1, Shape.DIAGONAL, "p", "phase", a -> Gates.phase(a[0]), CliffordSteps::rz,
            "P"),
    /**
     * The general single-qubit gate {@code u(θ, φ, λ)}, {@link Gates#u(double, double, double)};
     * OpenQASM's built-in {@code U}.
     */
    U("u", 0, 1, 3, Shape.DENSE, "U", "u", a -> Gates.u(a[0], a[1], a[2]), CliffordSteps::u, "U"),
    /** Controlled NOT on (control, target); OpenQASM {@code cx}. */
    CNOT("cnot", 1, 1, 0, Shape.PERMUTATION, "cx", null, a -> Gates.X,
            CliffordSteps.fixed(CliffordSteps.CNOT, 0, 1), "\u2295"),
    /** Controlled Y on (control, target). */
    CY("cy", 1, 1, 0, Shape.PERMUTATION, "cy", null, a -> Gates.Y,
            CliffordSteps.fixed(CliffordSteps.S_DAGGER, 1, CliffordSteps.CNOT, 0, 1,
                    CliffordSteps.S, 1), "Y"),
    /** Controlled Z, {@code diag(1, 1, 1, -1)}, symmetric in its two qubits. */
    CZ("cz", 0, 2, 0, Shape.DIAGONAL, "cz", null, a -> Gates.CZ,
            CliffordSteps.fixed(CliffordSteps.CZ, 0, 1),
            "\u25cf"),
    /** Controlled Hadamard on (control, target). */
    CH("ch", 1, 1, 0, Shape.DENSE, "ch", null, a -> Gates.H, null, "H"),
    /** {@code cphase(λ) = diag(1, 1, 1, e^{iλ})}, symmetric; OpenQASM {@code cp}. */
    CPHASE("cphase", 0, 2, 1, Shape.DIAGONAL, "cp", "cphase", a -> Gates.cphase(a[0]),
            CliffordSteps::cphase, "P"),
    /** {@code rx(θ)} with one control, on (control, target). */
    CRX("crx", 1, 1, 1, Shape.DENSE, "crx", "crx", a -> Gates.rx(a[0]), CliffordSteps::crx, "RX"),
    /** {@code ry(θ)} with one control, on (control, target). */
    CRY("cry", 1, 1, 1, Shape.DENSE, "cry", "cry", a -> Gates.ry(a[0]), CliffordSteps::cry,
            "RY"),
    /** {@code rz(θ)} with one control, on (control, target). */
    CRZ("crz", 1, 1, 1, Shape.DIAGONAL, "crz", "crz", a -> Gates.rz(a[0]),
            CliffordSteps::crz, "RZ"),
    /** Swaps two qubits. */
    SWAP("swap", 0, 2, 0, Shape.PERMUTATION, "swap", null, a -> Gates.SWAP,
            CliffordSteps.fixed(CliffordSteps.SWAP, 0, 1), "\u00d7"),
    /** The Ising coupling {@code rzz(θ) = exp(-iθ Z⊗Z/2)}; OpenQASM has no standard name. */
    RZZ("rzz", 0, 2, 1, Shape.DIAGONAL, null, "rzz", a -> Gates.rzz(a[0]), CliffordSteps::rzz,
            "RZZ"),
    /** Toffoli on (control1, control2, target); OpenQASM {@code ccx}. */
    TOFFOLI("toffoli", 2, 1, 0, Shape.PERMUTATION, "ccx", null, a -> Gates.X, null, "\u2295"),
    /** Fredkin (controlled SWAP) on (control, a, b); OpenQASM {@code cswap}. */
    FREDKIN("fredkin", 1, 2, 0, Shape.PERMUTATION, "cswap", null, a -> Gates.SWAP, null, "\u00d7"),
    /**
     * Any unitary given as a matrix, on as many targets as the matrix acts on. It has no fixed
     * matrix, angles, OpenQASM name or Clifford decomposition; its inverse is its adjoint.
     */
    UNITARY("unitary", 0, 0, 0, Shape.DENSE, null, null, null, null, "U");

    /** How an engine's kernel applies a gate. */
    public enum Shape {
        /** Phases only: each amplitude is multiplied by a diagonal entry. */
        DIAGONAL,
        /** A permutation of basis states with phases: amplitudes move, none mix. */
        PERMUTATION,
        /** A dense matrix: amplitudes mix. */
        DENSE
    }

    /**
     * One gate of a Clifford decomposition: a primitive gate ({@link #H}, {@link #S},
     * {@link #S_DAGGER}, {@link #X}, {@link #Y}, {@link #Z}, {@link #CNOT}, {@link #CZ} or
     * {@link #SWAP}) on positions of the decomposed gate's qubits (controls first, then
     * targets).
     *
     * @param gate the primitive gate
     * @param first the position of its first qubit
     * @param second the position of its second qubit, or -1 for a single-qubit primitive
     * @since 0.1
     */
    public record Step(Gate gate, int first, int second) {
    }

    /**
     * One weighted Pauli product of a gate's generator, on the gate's qubit positions:
     * {@code letters.charAt(j)} is the Pauli letter (I, X, Y or Z) on the gate's j-th qubit
     * (controls first, then targets; position 0 is the leftmost character).
     *
     * @param weight the real weight
     * @param letters one letter per qubit of the gate
     * @since 0.1
     */
    public record Term(double weight, String letters) {
    }

    private static final Map<String, Gate> BY_NAME = new HashMap<>();

    private static final Map<Gate, List<Term>> GENERATORS = Map.of(
            RX, List.of(new Term(1, "X")),
            RY, List.of(new Term(1, "Y")),
            RZ, List.of(new Term(1, "Z")),
            PHASE, List.of(new Term(1, "Z"), new Term(-1, "I")),
            RZZ, List.of(new Term(1, "ZZ")),
            CPHASE, List.of(new Term(-0.5, "II"), new Term(0.5, "ZI"), new Term(0.5, "IZ"),
                    new Term(-0.5, "ZZ")));

    static {
        for (Gate g : values()) {
            BY_NAME.put(key(g.name()), g);
            BY_NAME.put(key(g.id), g);
            if (g.qasm != null) {
                BY_NAME.put(key(g.qasm), g);
            }
        }
    }

    private final String id;
    private final int controls;
    private final int targets;
    private final int parameters;
    private final Shape shape;
    private final String qasm;
    private final String inverseId;
    private final Function<double[], Operator> matrix;
    private final Function<double[], List<Step>> steps;
    private final String label;

    Gate(String id, int controls, int targets, int parameters, Shape shape, String qasm,
            String inverseId, Function<double[], Operator> matrix,
            Function<double[], List<Step>> steps, String label) {
        this.id = id;
        this.controls = controls;
        this.targets = targets;
        this.parameters = parameters;
        this.shape = shape;
        this.qasm = qasm;
        this.inverseId = inverseId;
        this.matrix = matrix;
        this.steps = steps;
        this.label = label;
    }

    private static String key(String name) {
        return name.replace("_", "").toLowerCase(Locale.ROOT);
    }

    /**
     * Finds an entry by its constant name, its {@linkplain #id() identifier} or its OpenQASM 3
     * name, ignoring case and underscores.
     *
     * @param name the name
     * @return the entry, or empty if no entry has that name
     */
    public static Optional<Gate> find(String name) {
        Objects.requireNonNull(name, "name");
        return Optional.ofNullable(BY_NAME.get(key(name)));
    }

    /**
     * Returns the entry of a name, as {@link #find(String)}, or refuses the name.
     *
     * @param name the name
     * @return the entry
     * @throws IllegalArgumentException if no entry has that name; the message lists the known
     *     names
     */
    public static Gate lookup(String name) {
        return find(name).orElseThrow(() -> new IllegalArgumentException("unknown gate '"
                + Checks.excerpt(name) + "'; known gates: " + knownNames()));
    }

    /**
     * Returns every name {@link #lookup(String)} accepts, one per entry and OpenQASM name, in
     * catalogue order (for messages and documentation).
     *
     * @return the names, such as {@code "h"}, {@code "cnot (cx)"}
     */
    public static String knownNames() {
        StringBuilder sb = new StringBuilder();
        for (Gate g : values()) {
            sb.append(sb.length() == 0 ? "" : ", ").append(g.id);
            if (g.qasm != null && !g.qasm.equals(g.id)) {
                sb.append(" (").append(g.qasm).append(')');
            }
        }
        return sb.toString();
    }

    /**
     * Returns the identifier: the name of the builder method that records this gate, such as
     * {@code "h"}, {@code "sDagger"}, {@code "cnot"}; {@code "unitary"} for {@link #UNITARY}.
     *
     * @return the identifier
     */
    public String id() {
        return id;
    }

    /**
     * Returns the number of built-in control qubits: 1 for {@link #CNOT}, 2 for
     * {@link #TOFFOLI}, 0 for {@link #CZ} (a symmetric two-qubit diagonal).
     *
     * @return the control count
     */
    public int controls() {
        return controls;
    }

    /**
     * Returns the number of qubits the gate's {@linkplain #operator(double...) matrix} acts on,
     * or 0 for {@link #UNITARY} (as many as its matrix).
     *
     * @return the target count
     */
    public int targets() {
        return targets;
    }

    /**
     * Returns the number of qubits the gate is given: controls plus targets (0 for
     * {@link #UNITARY}).
     *
     * @return the qubit count
     */
    public int qubits() {
        return controls + targets;
    }

    /**
     * Returns the number of angles the gate takes.
     *
     * @return 0, 1 or 3
     */
    public int parameters() {
        return parameters;
    }

    /**
     * Returns how a kernel applies the gate's matrix on its targets. For {@link #UNITARY} this
     * is {@link Shape#DENSE}; engines read the actual shape of a given matrix from its entries.
     *
     * @return the shape
     */
    public Shape shape() {
        return shape;
    }

    /**
     * Returns the OpenQASM 3 name (of {@code stdgates.inc} or the built-in {@code U}), or
     * {@code null} for a gate without one ({@link #RZZ}, {@link #SQRT_X_DAGGER},
     * {@link #UNITARY}). Cross et al., "OpenQASM 3: A broader and deeper quantum assembly
     * language", ACM Transactions on Quantum Computing 3(3), 12 (2022),
     * doi:10.1145/3505636.
     *
     * @return the name or null
     */
    public String qasmName() {
        return qasm;
    }

    /**
     * Returns an OpenQASM 3 definition for a gate without a standard name that cannot be
     * written as the inverse of one, in terms of standard gates: for {@link #RZZ},
     * {@code gate rzz(theta) a, b { cx a, b; rz(theta) b; cx a, b; }} (exact: CNOT maps
     * {@code Z_b} to {@code Z_a Z_b}, Nielsen and Chuang 2010, §4.7.3). Null for every other
     * gate.
     *
     * @return the definition, or null
     */
    public String qasmDefinition() {
        return this == RZZ ? "gate rzz(theta) a, b { cx a, b; rz(theta) b; cx a, b; }" : null;
    }

    /**
     * Returns the matrix the gate applies to its targets (without its built-in controls:
     * {@link Gates#X} for {@link #CNOT}).
     *
     * @param angles as many finite angles, in radians, as {@link #parameters()}
     * @return the operator
     * @throws IllegalArgumentException if the angle count is wrong or an angle is not finite,
     *     or for {@link #UNITARY}
     */
    public Operator operator(double... angles) {
        requireAngles(angles);
        if (matrix == null) {
            throw new IllegalArgumentException("unitary has no fixed matrix; give the operator");
        }
        return matrix.apply(angles);
    }

    /**
     * Checks an angle array for this gate.
     *
     * @param angles the angles
     * @throws IllegalArgumentException if the count is wrong or an angle is not finite
     */
    void requireAngles(double[] angles) {
        Objects.requireNonNull(angles, "angles");
        if (angles.length != parameters) {
            throw new IllegalArgumentException("gate " + id + " takes " + parameters
                    + " angle(s) but " + angles.length + " were given");
        }
        for (double a : angles) {
            Checks.requireFinite(a, "an angle of " + id);
        }
    }

    /**
     * Returns the entry whose matrix is the inverse of this one's: {@link #S_DAGGER} for
     * {@link #S}, the gate itself for self-inverse and parameterised gates (whose inverse
     * negates the angles, see {@link #inverseAngles(double...)}) and for {@link #UNITARY}
     * (whose inverse is the adjoint matrix).
     *
     * @return the inverse entry
     */
    public Gate inverse() {
        return inverseId == null ? this : lookup(inverseId);
    }

    /**
     * Returns the angles of the inverse gate: {@code -θ} for rotations and phases,
     * {@code (-θ, -λ, -φ)} for {@link #U} (since {@code u(θ, φ, λ)† = u(-θ, -λ, -φ)}); empty
     * for gates without angles.
     *
     * @param angles this gate's angles
     * @return the inverse's angles
     * @throws IllegalArgumentException if the angle count is wrong or an angle is not finite
     */
    public double[] inverseAngles(double... angles) {
        requireAngles(angles);
        if (this == U) {
            return new double[] {-angles[0], -angles[2], -angles[1]};
        }
        double[] out = new double[angles.length];
        for (int i = 0; i < out.length; i++) {
            out[i] = -angles[i];
        }
        return out;
    }

    /**
     * Tells whether the gate with these angles is a Clifford gate: one that maps Pauli
     * products to Pauli products under conjugation (Gottesman 1998, "The Heisenberg
     * representation of quantum computers", arXiv:quant-ph/9807006), so the stabilizer engine
     * can run it. Rotations and phases are Clifford at multiples of π/2 (within 1e-12 of
     * one), {@link #CPHASE} and the controlled rotations at multiples of π;
     * {@link #T}, {@link #CH}, {@link #TOFFOLI}, {@link #FREDKIN} and {@link #UNITARY} never.
     *
     * @param angles the angles
     * @return whether it is Clifford
     * @throws IllegalArgumentException if the angle count is wrong or an angle is not finite
     */
    public boolean isClifford(double... angles) {
        requireAngles(angles);
        return steps != null && steps.apply(angles) != null;
    }

    /**
     * Returns the gate as a sequence of the stabilizer engine's primitive gates, equal to it up
     * to a global phase (which no measurement sees). The primitives are applied in list order.
     *
     * @param angles the angles
     * @return the steps, in order; empty for a gate equal to the identity up to phase
     * @throws IllegalArgumentException if the gate is not Clifford for these angles (see
     *     {@link #isClifford(double...)}), the angle count is wrong or an angle is not finite
     */
    public List<Step> cliffordSteps(double... angles) {
        requireAngles(angles);
        List<Step> out = steps == null ? null : steps.apply(angles);
        if (out == null) {
            throw new IllegalArgumentException("gate " + label(angles) + " is not a Clifford"
                    + " gate; " + (steps == null ? "it never is"
                    : "its angles must be multiples of " + (this == CPHASE || this == CRX
                    || this == CRY || this == CRZ ? "pi" : "pi/2")));
        }
        return out;
    }

    /**
     * Returns the generator {@code G} of a one-angle gate whose two-term parameter-shift rule
     * holds: the gate is exactly {@code exp(-iθG/2)} and {@code G} has two eigenvalues 2 apart,
     * so {@code d<H>/dθ = (<H>(θ + π/2) - <H>(θ - π/2)) / 2} (Schuld, Bergholm, Gogolin, Izaac
     * and Killoran 2019, "Evaluating analytic gradients on quantum hardware", Phys. Rev. A 99,
     * 032331, doi:10.1103/PhysRevA.99.032331) and {@code dU/dθ = (-i/2) G U}. These are
     * {@link #RX}, {@link #RY}, {@link #RZ} ({@code G} = X, Y, Z), {@link #RZZ} (Z⊗Z),
     * {@link #PHASE} ({@code Z - I}, since {@code phase(λ) = e^{iλ/2} rz(λ)}) and
     * {@link #CPHASE} ({@code -2|11><11|}); the others have none.
     *
     * @return the terms of {@code G}, or an empty list
     */
    public List<Term> generator() {
        return GENERATORS.getOrDefault(this, List.of());
    }

    /**
     * Returns the drawing label of each target, in the textbook symbols of Nielsen and Chuang
     * 2010, §4.3: {@code {"⊕"}} for the target of {@link #CNOT} and {@link #TOFFOLI},
     * {@code {"×", "×"}} for the two ends of {@link #SWAP} and {@link #FREDKIN}, a filled dot
     * {@code "●"} for each qubit of {@link #CZ} and for the first qubit of {@link #CPHASE}
     * (whose second carries {@code "P(λ)"}); otherwise the name with its angles, such as
     * {@code {"RZ(pi/2)"}}, and {@code "U"} (or {@code "U0"}, {@code "U1"}, ... for several
     * targets) for {@link #UNITARY}. Controls are drawn by the drawing itself, as {@code "●"}.
     *
     * @param angles the angles
     * @param count the number of targets (used by {@link #UNITARY})
     * @return one label per target
     */
    public String[] targetLabels(double[] angles, int count) {
        String[] out = new String[count];
        if (this == UNITARY) {
            for (int j = 0; j < count; j++) {
                out[j] = count == 1 ? "U" : "U" + j;
            }
            return out;
        }
        String full = label(angles);
        for (int j = 0; j < count; j++) {
            out[j] = full;
        }
        if (this == CPHASE) {
            out[0] = "\u25cf";
        }
        return out;
    }

    /** The label with its angles, such as {@code "RZ(pi/2)"}. */
    String label(double[] angles) {
        if (angles.length == 0) {
            return label;
        }
        StringBuilder sb = new StringBuilder(label).append('(');
        for (int i = 0; i < angles.length; i++) {
            sb.append(i > 0 ? "," : "").append(angleText(angles[i]));
        }
        return sb.append(')').toString();
    }

    /**
     * Returns the entry of this gate with {@code extra} more controls, if it has one of its
     * own: {@link #X} with 1 is {@link #CNOT}, with 2 {@link #TOFFOLI}; {@link #CNOT} with 1
     * is {@link #TOFFOLI}; {@link #Z} with 1 is {@link #CZ}, {@link #PHASE} with 1
     * {@link #CPHASE}; {@link #Y}, {@link #H}, {@link #RX}, {@link #RY}, {@link #RZ} with 1 are
     * {@link #CY}, {@link #CH}, {@link #CRX}, {@link #CRY}, {@link #CRZ}; {@link #SWAP} with 1
     * is {@link #FREDKIN}. With 0 it is this entry.
     *
     * @param extra the number of added controls, at least 0
     * @return the entry, or empty if the controlled form has none
     */
    public Optional<Gate> withControls(int extra) {
        if (extra < 0) {
            throw new IllegalArgumentException("extra controls must be at least 0 but was "
                    + extra);
        }
        if (extra == 0) {
            return Optional.of(this);
        }
        Gate base = this == CNOT ? X : this;
        int k = extra + (this == CNOT ? 1 : 0);
        Gate out = null;
        if (k == 1) {
            out = CONTROLLED.get(base);
        } else if (k == 2 && base == X) {
            out = TOFFOLI;
        }
        return Optional.ofNullable(out);
    }

    private static final Map<Gate, Gate> CONTROLLED = Map.of(X, CNOT, Y, CY, Z, CZ, H, CH,
            PHASE, CPHASE, RX, CRX, RY, CRY, RZ, CRZ, SWAP, FREDKIN);

    /**
     * Returns the fixed catalogue gate whose full matrix (built-in controls included, controls
     * on the low index bits) equals {@code op} exactly, if any: {@link Gates#CNOT} is
     * {@link #CNOT}, {@link Gates#H} is {@link #H}. Gates with angles are never matched.
     */
    static Optional<Gate> matching(Operator op) {
        for (Gate g : values()) {
            if (g.parameters == 0 && g != UNITARY && g.qubits() == op.qubits()
                    && java.util.Arrays.equals(g.fullMatrix(), op.raw())) {
                return Optional.of(g);
            }
        }
        return Optional.empty();
    }

    /** The matrix on controls and targets of a gate without angles, controls low. */
    private double[] fullMatrix() {
        double[] m = operator().raw();
        if (controls == 0) {
            return m;
        }
        int dt = 1 << targets;
        int d = dt << controls;
        int all = (1 << controls) - 1;
        double[] out = new double[2 * d * d];
        for (int col = 0; col < d; col++) {
            if ((col & all) != all) {
                out[2 * (col * d + col)] = 1;
                continue;
            }
            int tc = col >>> controls;
            for (int tr = 0; tr < dt; tr++) {
                int row = (tr << controls) | all;
                out[2 * (row * d + col)] = m[2 * (tr * dt + tc)];
                out[2 * (row * d + col) + 1] = m[2 * (tr * dt + tc) + 1];
            }
        }
        return out;
    }

    /**
     * Writes an angle for a drawing: a multiple of π with a denominator up to 16 as
     * {@code "pi/4"}, {@code "-3pi/8"}; otherwise up to four decimals.
     */
    static String angleText(double x) {
        if (x == 0) {
            return "0";
        }
        for (int den = 1; den <= 16; den++) {
            double num = x * den / Math.PI;
            long r = Math.round(num);
            if (r != 0 && Math.abs(num - r) < 1e-12 * Math.max(1, Math.abs(num))) {
                String s = (r == 1 ? "" : r == -1 ? "-" : Long.toString(r)) + "pi";
                return den == 1 ? s : s + "/" + den;
            }
        }
        String s = String.format(Locale.ROOT, "%.4f", x);
        s = s.replaceAll("0+$", "");
        return s.endsWith(".") ? s + "0" : s;
    }
}
