package dev.qsim.stabilizer;

import java.util.ArrayList;
import java.util.List;

import dev.qsim.observable.PauliProduct;

/** Test helpers: a table's generators as signed dense text, and expectations of text. */
final class Tables {
    private Tables() {
    }

    /** The generators as {@code "+XZI"}-style text: sign, then the highest qubit leftmost. */
    static List<String> texts(StabilizerTableau t) {
        List<String> out = new ArrayList<>();
        for (PauliProduct p : t.generators()) {
            String dense = p.toDense(t.qubits());
            out.add(dense.startsWith("-") ? dense : "+" + dense);
        }
        return out;
    }

    /** The expectation of a product given as text ({@link PauliProduct#parse(String)}). */
    static int expect(StabilizerTableau t, String text) {
        return t.expectation(PauliProduct.parse(text));
    }
}
