package dev.qsim.text;

import java.util.List;

import dev.qsim.Expression;
import dev.qsim.Expression.Op;
import dev.qsim.text.Syntax.Binary;
import dev.qsim.text.Syntax.Call;
import dev.qsim.text.Syntax.Cast;
import dev.qsim.text.Syntax.Duration;
import dev.qsim.text.Syntax.Expr;
import dev.qsim.text.Syntax.IndexItem;
import dev.qsim.text.Syntax.IndexSet;
import dev.qsim.text.Syntax.Indexed;
import dev.qsim.text.Syntax.Literal;
import dev.qsim.text.Syntax.Measure;
import dev.qsim.text.Syntax.Name;
import dev.qsim.text.Syntax.Position;
import dev.qsim.text.Syntax.Range;
import dev.qsim.text.Syntax.Single;
import dev.qsim.text.Syntax.Unary;

/**
 * Evaluates expressions to {@link Value}s (folding what is known when the file is read) and
 * resolves operands to qubit and clbit indices (registers, single elements, ranges and sets of
 * indices, aliases). Each node evaluated and each index an operand stands for costs a step of
 * the {@link Budget}. Recursion follows the expression tree, whose depth the parser bounds.
 */
final class Evaluator {
    /** An operand resolved to indices. */
    record Resolved(int[] indices, boolean single) {
    }

    private final Expander expander;
    private final Scope scope;
    private final Budget budget;

    Evaluator(Expander expander, Scope scope, Budget budget) {
        this.expander = expander;
        this.scope = scope;
        this.budget = budget;
    }

    private CircuitFormatException problem(Position at, String message) {
        return expander.problem(at, message);
    }

    /**
     * The most nested evaluations, each open frame of the scope counting as
     * {@link #FRAME_WEIGHT}: evaluation recurses once per level of an expression, and a
     * subroutine called in an expression opens a frame, so the two together bound the stack.
     */
    static final int MAX_WEIGHT = 1600;
    static final int FRAME_WEIGHT = 8;

    private int nesting;

    /** Evaluates an expression. */
    Value value(Expr e) {
        if (nesting + FRAME_WEIGHT * scope.depth() >= MAX_WEIGHT) {
            throw expander.at().error("expressions and the subroutine calls in them nest too"
                    + " deep to evaluate (more than " + MAX_WEIGHT + " levels, each block,"
                    + " loop body, gate body or call counting " + FRAME_WEIGHT + ")");
        }
        nesting++;
        try {
            return compute(e);
        } finally {
            nesting--;
        }
    }

    private Value compute(Expr e) {
        budget.spend(1, expander.at());
        if (e instanceof Literal l) {
            return Value.of(l);
        }
        if (e instanceof Name n) {
            return name(n);
        }
        if (e instanceof Indexed i) {
            Scope.Symbol base = baseSymbol(i);
            if (base instanceof Scope.Bits) {
                return Value.of(register(bits(i).indices(), i.at()));
            }
            if (base instanceof Scope.Qubits) {
                throw i.at().error("qubits are not values; measure them into bits first");
            }
            throw i.at().error("indexing a classical value (bit access to an integer) is"
                    + " unsupported; index a bit register instead");
        }
        if (e instanceof Unary u) {
            Value a = value(u.operand());
            try {
                return Value.apply(u.op(), a);
            } catch (IllegalArgumentException x) {
                throw problem(u.at(), x.getMessage());
            }
        }
        if (e instanceof Binary b) {
            Value a = value(b.left());
            Value c = value(b.right());
            try {
                return Value.apply(b.op(), a, c);
            } catch (IllegalArgumentException x) {
                throw problem(b.at(), x.getMessage());
            }
        }
        if (e instanceof Call c) {
            return call(c);
        }
        if (e instanceof Cast c) {
            Value v = value(c.operand());
            int width = expander.width(c.type());
            try {
                return v.convert(c.type().kind(), width);
            } catch (IllegalArgumentException x) {
                throw problem(c.at(), x.getMessage());
            }
        }
        if (e instanceof Measure m) {
            throw m.at().error("measure gives a value only as the whole right-hand side of an"
                    + " assignment, of a declaration or of a return");
        }
        Duration d = (Duration) e;
        throw d.at().error("a duration such as " + d.value() + d.unit() + " may appear only in"
                + " delay[...]; durations in expressions are unsupported");
    }

    private Value name(Name n) {
        Scope.Symbol s = scope.find(n.name(), n.at());
        if (s instanceof Scope.Constant c) {
            return c.value();
        }
        if (s instanceof Scope.Variable v) {
            return Value.of(v.value());
        }
        if (s instanceof Scope.Bits b) {
            return Value.of(register(b.indices(), n.at()));
        }
        if (s instanceof Scope.Qubits) {
            throw n.at().error("'" + Lexer.clip(n.name()) + "' names qubits, which are not"
                    + " values; measure them into bits first");
        }
        if (scope.subroutine(n.name()) != null || scope.gate(n.name()) != null) {
            throw n.at().error("'" + Lexer.clip(n.name()) + "' is a gate or subroutine, not a"
                    + " value");
        }
        throw n.at().error("unknown name '" + Lexer.clip(n.name()) + "' in an expression;"
                + " declare it first (numbers, pi, tau, euler, true, false, the functions sin,"
                + " cos, tan, arcsin, arccos, arctan, exp, log, sqrt, and declared names are"
                + " allowed)");
    }

    /**
     * Bits read as an unsigned integer ({@link Expression#clbits(int...)}).
     *
     * @throws CircuitFormatException if there are more than 63 or one repeats
     */
    static Expression register(int[] clbits, Position at) {
        if (clbits.length > 63) {
            throw at.error("a register of " + clbits.length + " bits cannot be read as a"
                    + " number; at most 63 bits can");
        }
        requireDistinct(clbits, at, "the bits read as a number");
        return Expression.clbits(clbits);
    }

    /**
     * Refuses indices (of qubits or bits, all below {@link dev.qsim.Circuit#MAX_QUBITS}) that
     * repeat, in time linear in their count.
     *
     * @param what what they are, for the message
     */
    static void requireDistinct(int[] indices, Position at, String what) {
        if (indices.length <= 16) {
            for (int i = 0; i < indices.length; i++) {
                for (int j = 0; j < i; j++) {
                    if (indices[i] == indices[j]) {
                        throw repeated(indices, indices[i], at, what);
                    }
                }
            }
            return;
        }
        java.util.BitSet seen = new java.util.BitSet();
        for (int x : indices) {
            if (seen.get(x)) {
                throw repeated(indices, x, at, what);
            }
            seen.set(x);
        }
    }

    private static CircuitFormatException repeated(int[] indices, int x, Position at,
            String what) {
        return at.error("index " + x + " appears twice in " + what + " "
                + Lexer.clip(java.util.Arrays.toString(indices)) + "; each may appear once");
    }

    private Value call(Call c) {
        Op op = function(c.name());
        List<Expr> args = c.arguments();
        if (op != null || c.name().equals("floor") || c.name().equals("ceiling")
                || c.name().equals("popcount") || c.name().equals("pow")
                || c.name().equals("mod")) {
            boolean two = c.name().equals("pow") || c.name().equals("mod");
            if (args.size() != (two ? 2 : 1)) {
                throw c.at().error("the function " + c.name() + " takes " + (two ? 2 : 1)
                        + " argument(s) but " + args.size() + " were given");
            }
            Value a = value(args.get(0));
            try {
                if (two) {
                    return Value.apply(c.name().equals("pow") ? Op.POW : Op.MOD, a,
                            value(args.get(1)));
                }
                if (op != null) {
                    return Value.apply(op, a);
                }
            } catch (IllegalArgumentException x) {
                throw problem(c.at(), x.getMessage());
            }
            if (!a.isConstant()) {
                throw problem(c.at(), "the function " + c.name() + " of a value known only"
                        + " during the shot is unsupported (the circuit's expressions have no"
                        + " such operator)");
            }
            if (c.name().equals("popcount")) {
                if (a.isFloat()) {
                    throw problem(c.at(), "popcount needs an integer but " + a.show()
                            + " is a float");
                }
                return Value.ofInt(Long.bitCount(a.asLong()));
            }
            return Value.ofReal(c.name().equals("floor") ? Math.floor(a.asDouble())
                    : Math.ceil(a.asDouble()));
        }
        if (scope.subroutine(c.name()) != null) {
            return expander.subroutineValue(c);
        }
        throw c.at().error("unknown function or subroutine '" + Lexer.clip(c.name()) + "'");
    }

    /** The unary function of a name, or null. */
    static Op function(String name) {
        switch (name) {
            case "sin":
                return Op.SIN;
            case "cos":
                return Op.COS;
            case "tan":
                return Op.TAN;
            case "arcsin":
                return Op.ARCSIN;
            case "arccos":
                return Op.ARCCOS;
            case "arctan":
                return Op.ARCTAN;
            case "exp":
                return Op.EXP;
            case "ln":
            case "log":
                return Op.LN;
            case "sqrt":
                return Op.SQRT;
            default:
                return null;
        }
    }

    /**
     * Evaluates an integer known when the file is read, such as a size, an index or a
     * control count.
     *
     * @param what what it is, for messages
     */
    long constantInteger(Expr e, String what) {
        Value v = value(e);
        if (!v.isConstant()) {
            throw e.at().error("the " + what + " must be known when the file is read, but "
                    + v.show() + " is computed during the shot");
        }
        if (!v.isWhole()) {
            throw e.at().error("the " + what + " must be a whole number but was " + v.show());
        }
        return v.asLong();
    }

    // ------------------------------------------------------------------ operands

    private Scope.Symbol baseSymbol(Expr e) {
        Expr x = e;
        while (x instanceof Indexed i) {
            x = i.base();
        }
        if (x instanceof Name n) {
            return scope.find(n.name(), n.at());
        }
        throw x.at().error("expected a register name before '['");
    }

    private static String baseName(Expr e) {
        Expr x = e;
        while (x instanceof Indexed i) {
            x = i.base();
        }
        return x instanceof Name n ? n.name() : "?";
    }

    /** Resolves a qubit operand. */
    Resolved qubits(Expr e) {
        return resolve(e, true, true);
    }

    /** Resolves a clbit operand. */
    Resolved bits(Expr e) {
        return resolve(e, false, true);
    }

    /**
     * Resolves an operand; {@code whole} tells whether the register a name stands for is used
     * whole (and its elements paid for) or only indexed (and only the picked ones paid for).
     */
    private Resolved resolve(Expr e, boolean quantum, boolean whole) {
        String kind = quantum ? "qubit" : "bit";
        if (e instanceof Name n) {
            Scope.Symbol s = scope.find(n.name(), n.at());
            int[] indices;
            boolean single;
            if (quantum && s instanceof Scope.Qubits q) {
                indices = q.indices();
                single = q.single();
            } else if (!quantum && s instanceof Scope.Bits b) {
                indices = b.indices();
                single = b.single();
            } else if (s == null) {
                throw n.at().error("unknown " + kind + " register '" + Lexer.clip(n.name())
                        + "'");
            } else {
                throw n.at().error("'" + Lexer.clip(n.name()) + "' is not a " + kind
                        + " register");
            }
            if (whole) {
                budget.spend(indices.length, expander.at());
            }
            return new Resolved(indices, single);
        }
        if (e instanceof Indexed i) {
            Resolved base = resolve(i.base(), quantum, false);
            int[] picked = select(base.indices(), i.index(), kind, baseName(i.base()));
            return new Resolved(picked, i.index() instanceof Single);
        }
        throw e.at().error("expected a " + kind + " register or element but found an"
                + " expression");
    }

    private int index(Expr e, int size, String kind, String name) {
        long i = constantInteger(e, "index");
        long j = i < 0 ? i + size : i;
        if (j < 0 || j >= size) {
            throw e.at().error("index " + i + " is out of range [0, " + (size - 1) + "] for "
                    + kind + " register '" + Lexer.clip(name) + "'" + (size > 0 ? "" : ""));
        }
        return (int) j;
    }

    private int[] select(int[] base, IndexItem item, String kind, String name) {
        int size = base.length;
        if (item instanceof Single s) {
            budget.spend(1, expander.at());
            return new int[] {base[index(s.value(), size, kind, name)]};
        }
        if (item instanceof IndexSet set) {
            budget.spend(set.values().size(), expander.at());
            int[] out = new int[set.values().size()];
            for (int k = 0; k < out.length; k++) {
                out[k] = base[index(set.values().get(k), size, kind, name)];
            }
            return out;
        }
        Range r = (Range) item;
        long step = r.step() == null ? 1 : constantInteger(r.step(), "step of a range");
        if (step == 0) {
            throw r.at().error("the step of a range must not be 0");
        }
        int start = r.start() == null ? (step > 0 ? 0 : size - 1)
                : index(r.start(), size, kind, name);
        int end = r.end() == null ? (step > 0 ? size - 1 : 0) : index(r.end(), size, kind, name);
        long count = (end - start) / step + 1;
        if (count <= 0 || (end - start) != 0 && Long.signum(end - start) != Long.signum(step)) {
            throw r.at().error("the range selects no " + kind + " of register '"
                    + Lexer.clip(name) + "' (from " + start + " to " + end + " in steps of "
                    + step + ")");
        }
        budget.spend(count, expander.at());
        int[] out = new int[(int) count];
        for (int k = 0; k < out.length; k++) {
            out[k] = base[(int) (start + k * step)];
        }
        return out;
    }
}
