package dev.qsim.text;

import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.IdentityHashMap;
import java.util.List;
import java.util.Set;

import dev.qsim.Circuit;
import dev.qsim.Expression;
import dev.qsim.text.Syntax.Alias;
import dev.qsim.text.Syntax.BitDeclaration;
import dev.qsim.text.Syntax.Expr;
import dev.qsim.text.Syntax.Measure;
import dev.qsim.text.Syntax.Position;
import dev.qsim.text.Syntax.QubitDeclaration;
import dev.qsim.text.Syntax.Statement;
import dev.qsim.text.Syntax.VariableDeclaration;

/**
 * Runs the declarations of a program for the {@link Expander}: qubit and bit registers (each
 * takes the next indices), classical variables (declared on a builder of their own while
 * reading, to get the expressions that read them, and on the circuit's builder at the end),
 * constants and inputs (values known when read), and aliases. A variable declared in a block is
 * one of the circuit's (they are all global there): named as written unless the circuit has
 * that name or a standard gate has it, and used again by its declaration's next run once the
 * block of the last run has closed.
 */
final class Declarations {
    private final Expander ex;
    private final Scope scope;
    private final Evaluator eval;
    private final Budget budget;
    private final QasmReader.Settings settings;
    /** Declares the circuit's variables while reading, to get the expressions that read them. */
    private final Circuit.Builder variables = Circuit.builder(1, 0);
    private final List<Circuit.Variable> declared = new ArrayList<>();
    private final Set<String> circuitNames = new HashSet<>();
    private final Set<String> inputsUsed = new HashSet<>();
    private int qubits;
    private int clbits;

    Declarations(Expander ex, Scope scope, Evaluator eval, Budget budget,
            QasmReader.Settings settings) {
        this.ex = ex;
        this.scope = scope;
        this.eval = eval;
        this.budget = budget;
        this.settings = settings;
    }

    /** The qubits declared so far. */
    int qubits() {
        return qubits;
    }

    /** The classical bits declared so far. */
    int clbits() {
        return clbits;
    }

    /** The circuit's variables, in the order declared. */
    List<Circuit.Variable> variables() {
        return declared;
    }

    /** The inputs the program has declared. */
    Set<String> inputsUsed() {
        return inputsUsed;
    }

    /**
     * Takes the next {@code n} classical bits (for a value a subroutine returns from a
     * measurement).
     */
    int[] newBits(int n) {
        if ((long) clbits + n > Circuit.MAX_QUBITS) {
            throw ex.at().error("the program needs more than " + Circuit.MAX_QUBITS
                    + " classical bits");
        }
        int[] bits = range(clbits, n);
        clbits += n;
        return bits;
    }

    /** A variable of the circuit declared in a block, and the declaration it came from. */
    private record Local(VariableDeclaration site, String name) {
    }

    /** The variables declared in each open block, released when it closes. */
    private final ArrayDeque<List<Local>> blockLocals = new ArrayDeque<>();
    /** Variables of closed blocks, by declaration, free for that declaration to use again. */
    private final IdentityHashMap<VariableDeclaration, ArrayDeque<String>> free =
            new IdentityHashMap<>();

    /** A block's frame has opened. */
    void openBlock() {
        blockLocals.push(new ArrayList<>());
    }

    /** A block's frame has closed: its variables are free for their declarations again. */
    void closeBlock() {
        for (Local l : blockLocals.pop()) {
            free.computeIfAbsent(l.site(), k -> new ArrayDeque<>()).push(l.name());
        }
    }

    /** Runs a declaration of qubits, bits, a variable, a constant, an input or an alias. */
    void declare(Statement s) {
        if (s instanceof QubitDeclaration d) {
            int n = size(d.size(), "qubit");
            if ((long) qubits + n > Circuit.MAX_QUBITS) {
                throw d.nameAt().error("register '" + Lexer.clip(d.name()) + "' brings the qubit"
                        + " count to " + ((long) qubits + n) + " but at most "
                        + Circuit.MAX_QUBITS + " are allowed");
            }
            budget.spend(n, ex.at());
            scope.declare(d.name(), new Scope.Qubits(range(qubits, n), d.size() == null),
                    d.nameAt());
            qubits += n;
        } else if (s instanceof BitDeclaration d) {
            bits(d);
        } else if (s instanceof VariableDeclaration d) {
            variable(d);
        } else if (s instanceof Alias a) {
            alias(a);
        } else {
            throw new IllegalStateException("no expansion for " + s.getClass());
        }
    }

    private static int[] range(int first, int n) {
        int[] out = new int[n];
        for (int i = 0; i < n; i++) {
            out[i] = first + i;
        }
        return out;
    }

    /** The size of a register, 1 when not given. */
    int size(Expr e, String kind) {
        if (e == null) {
            return 1;
        }
        long n = eval.constantInteger(e, "register size");
        if (n < 1 || n > Circuit.MAX_QUBITS) {
            throw e.at().error("a register needs at least 1 " + kind + " and at most "
                    + Circuit.MAX_QUBITS + ", but the size was " + n);
        }
        return (int) n;
    }

    private void bits(BitDeclaration d) {
        int n = size(d.size(), "bit");
        if ((long) clbits + n > Circuit.MAX_QUBITS) {
            throw d.nameAt().error("register '" + Lexer.clip(d.name()) + "' brings the bit"
                    + " count to " + ((long) clbits + n) + " but at most " + Circuit.MAX_QUBITS
                    + " are allowed");
        }
        budget.spend(n, ex.at());
        int[] indices = range(clbits, n);
        scope.declare(d.name(), new Scope.Bits(indices, d.size() == null, false), d.nameAt());
        clbits += n;
        if (d.value() instanceof Measure m) {
            ex.measure(m.operand(), indices);
        } else if (d.value() != null) {
            ex.assignBits(indices, eval.value(d.value()), d.value().at());
        }
    }

    private void variable(VariableDeclaration d) {
        Syntax.Kind kind = d.type().kind();
        int width = ex.width(d.type());
        switch (d.storage()) {
            case CONSTANT: {
                Value v = eval.value(d.value());
                if (!v.isConstant()) {
                    throw d.value().at().error("the value of const '" + Lexer.clip(d.name())
                            + "' must be known when the file is read, but " + v.show()
                            + " is computed during the shot");
                }
                scope.declare(d.name(), new Scope.Constant(v.convert(kind, width),
                        "the constant"), d.nameAt());
                return;
            }
            case INPUT: {
                Number given = settings.inputs().get(d.name());
                if (given == null) {
                    throw d.nameAt().error("input '" + Lexer.clip(d.name()) + "' has no value;"
                            + " give it with QasmReader.Settings.withInput(\""
                            + Lexer.clip(d.name()) + "\", value)");
                }
                inputsUsed.add(d.name());
                Value v = given instanceof Double x ? Value.ofReal(x) : Value.ofInt(
                        given.longValue());
                scope.declare(d.name(), new Scope.Constant(v.convert(kind, width), "the input"),
                        d.nameAt());
                return;
            }
            default:
                break;
        }
        Circuit.VariableType type = kind == Syntax.Kind.INT ? Circuit.VariableType.INT
                : kind == Syntax.Kind.UINT ? Circuit.VariableType.UINT
                : kind == Syntax.Kind.FLOAT ? Circuit.VariableType.FLOAT
                : kind == Syntax.Kind.ANGLE ? Circuit.VariableType.ANGLE
                : Circuit.VariableType.BOOL;
        Value init = null;
        if (d.value() instanceof Measure m) {
            throw m.at().error("a measurement gives bits; declare a bit or bit register to"
                    + " receive it");
        } else if (d.value() != null) {
            init = eval.value(d.value());
        }
        // A declaration run again (a loop's next pass) uses the variable of its last run once
        // that run's block has closed, set to 0 when it has no value of its own. Not inside a
        // subroutine, whose returned value may still read it.
        ArrayDeque<String> reusable = ex.inSubroutine() ? null : free.get(d);
        String name = reusable != null && !reusable.isEmpty() ? reusable.pop() : null;
        Expression e;
        if (name == null) {
            name = circuitName(d.name());
            e = variables.declare(name, type, width, null);
            declared.add(new Circuit.Variable(name, type, type == Circuit.VariableType.INT
                    || type == Circuit.VariableType.UINT ? width
                    : type == Circuit.VariableType.BOOL ? 1 : 64));
        } else {
            e = variables.variable(name);
            if (init == null) {
                init = type == Circuit.VariableType.BOOL ? Value.ofBool(false)
                        : type == Circuit.VariableType.FLOAT
                        || type == Circuit.VariableType.ANGLE ? Value.ofReal(0) : Value.ofInt(0);
            }
        }
        scope.declare(d.name(), new Scope.Variable(name, e, type), d.nameAt());
        if (!blockLocals.isEmpty() && !ex.inSubroutine()) {
            blockLocals.peek().add(new Local(d, name));
        }
        if (init != null) {
            ex.emit(new Ops.AssignOp(name, ex.expression(init, "the value of '"
                    + Lexer.clip(d.name()) + "'"), Ops.where(ex.at())));
        }
    }

    /**
     * A name for a new variable of the circuit: as written, or with a suffix when another
     * variable has it (a local one declared again) or a standard gate has it (a block may
     * shadow a gate's name, but the writer declares every variable at the top level).
     */
    private String circuitName(String name) {
        String n = name;
        for (int k = 2; QasmGates.find(n) != null || !circuitNames.add(n); k++) {
            n = name + "_" + k;
        }
        return n;
    }

    private void alias(Alias a) {
        List<int[]> parts = new ArrayList<>();
        Boolean quantum = null;
        long total = 0;
        for (Expr part : a.parts()) {
            Scope.Symbol base = ex.symbolOf(part);
            boolean q = base instanceof Scope.Qubits;
            if (!q && !(base instanceof Scope.Bits)) {
                throw part.at().error("an alias names qubits or bits, but '"
                        + Lexer.clip(Expander.nameOf(part)) + "' is neither");
            }
            if (quantum != null && quantum != q) {
                throw part.at().error("an alias cannot join qubits and bits");
            }
            quantum = q;
            int[] indices = q ? eval.qubits(part).indices() : eval.bits(part).indices();
            parts.add(indices);
            total += indices.length;
        }
        int[] all = new int[(int) Math.min(total, Integer.MAX_VALUE - 8)];
        int k = 0;
        for (int[] p : parts) {
            System.arraycopy(p, 0, all, k, p.length);
            k += p.length;
        }
        if (quantum) {
            requireDistinct(all, a.at(), "the qubits of alias '" + Lexer.clip(a.name()) + "'");
            scope.declare(a.name(), new Scope.Qubits(all, false), a.nameAt());
        } else {
            requireDistinct(all, a.at(), "the bits of alias '" + Lexer.clip(a.name()) + "'");
            scope.declare(a.name(), new Scope.Bits(all, false, false), a.nameAt());
        }
    }

    private static void requireDistinct(int[] indices, Position where, String what) {
        Evaluator.requireDistinct(indices, where, what);
    }
}
