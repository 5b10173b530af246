package dev.qsim.spark.cli;

import java.util.List;

import dev.qsim.observable.Observable;

/**
 * Reads an observable from terms written {@code WEIGHT PAULI}, such as {@code "0.5 Z0 Z1"},
 * {@code "-1.2 X0"} or {@code "0.25 XIZ"}: a decimal weight, then a Pauli product as
 * {@link dev.qsim.observable.PauliProduct#parse(String)} reads it (letters with qubit indices,
 * or the dense form with the highest qubit leftmost).
 */
final class ObservableTerms {
    /** The most terms: {@value}. */
    static final int MAX_TERMS = 100_000;

    private ObservableTerms() {
    }

    /**
     * Reads the terms.
     *
     * @param terms one term per entry, at least one
     * @return the observable, terms in the order given
     * @throws IllegalArgumentException if a term is malformed; the message quotes it
     */
    static Observable read(List<String> terms) {
        if (terms.isEmpty() || terms.size() > MAX_TERMS) {
            throw new IllegalArgumentException("give 1 to " + MAX_TERMS + " observable terms"
                    + " but " + terms.size() + " were given");
        }
        Observable.Builder b = Observable.builder();
        for (String term : terms) {
            String t = term.strip();
            int space = t.indexOf(' ');
            if (space < 0) {
                throw new IllegalArgumentException("the observable term '"
                        + ToolFiles.excerpt(term) + "' is not WEIGHT PAULI (such as '0.5 Z0 Z1')");
            }
            double w = ToolFiles.number(t.substring(0, space), "the weight of term '"
                    + ToolFiles.excerpt(term) + "'");
            try {
                b.add(w, t.substring(space + 1).strip());
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException("the observable term '"
                        + ToolFiles.excerpt(term) + "': " + e.getMessage(), e);
            }
        }
        return b.build();
    }
}
