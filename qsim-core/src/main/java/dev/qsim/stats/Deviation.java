package dev.qsim.stats;

/**
 * One outcome of a comparison: how often it was seen, how often the prediction expected it, and
 * the standardized (Pearson) residual {@code (observed - expected) / sqrt(expected)} (Agresti
 * 2013, <i>Categorical Data Analysis</i>, 3rd ed., §2.4.5). The residual is infinite for an
 * outcome seen although its predicted probability is zero.
 *
 * @param bits the outcome's bitstring, highest bit leftmost
 * @param observed the count seen
 * @param expected the expected count, {@code shots * predicted probability}
 * @param residual the standardized residual
 * @since 0.1
 */
public record Deviation(String bits, long observed, double expected, double residual) {
}
