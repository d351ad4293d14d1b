package org.zweep.driver.dialect;

import java.math.BigDecimal;

/**
 * Formats numbers as IEEE 488.2 NR3 ({@code 1.5E+03}, §8.7.4 explicit radix point and exponent)
 * with the fewest digits that still give the exact double back. Scaling to a prefixed unit is a
 * decimal point shift, so {@code 1234.5 Hz} in kHz is exactly {@code 1.2345E+00}.
 */
final class Nr3 {
    private Nr3() {
    }

    /**
     * @param value a finite number
     * @param pointShift how many places to move the decimal point left (3 for kilo, -3 for milli)
     */
    static String format(double value, int pointShift) {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException("not a finite number: " + value);
        }
        if (value == 0.0) {
            return "0.0E+00";
        }
        BigDecimal d = new BigDecimal(Double.toString(value)).movePointLeft(pointShift).stripTrailingZeros();
        String digits = d.unscaledValue().abs().toString();
        int exponent = digits.length() - 1 - d.scale();
        String fraction = digits.length() > 1 ? digits.substring(1) : "0";
        return (d.signum() < 0 ? "-" : "") + digits.charAt(0) + "." + fraction + "E"
                + (exponent < 0 ? "-" : "+") + (Math.abs(exponent) < 10 ? "0" : "") + Math.abs(exponent);
    }
}
