package org.zweep.runner.conformance;

import java.math.BigDecimal;

/** A double written without a trailing zero or exponent ({@code 0.95}). */
final class BigDecimalText {
    private BigDecimalText() {
    }

    static String of(double v) {
        return new BigDecimal(Double.toString(v)).stripTrailingZeros().toPlainString();
    }
}
