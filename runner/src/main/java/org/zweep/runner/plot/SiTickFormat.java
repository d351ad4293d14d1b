package org.zweep.runner.plot;

import java.text.FieldPosition;
import java.text.NumberFormat;
import java.text.ParsePosition;
import org.zweep.driver.impedance.Unit;
import org.zweep.runner.analysis.Si;

/** Tick labels with SI prefixes ({@code 100 k}, {@code 1.5 n}); the unit is in the axis label. */
final class SiTickFormat extends NumberFormat {
    private static final long serialVersionUID = 1L;

    @Override
    public StringBuffer format(double number, StringBuffer toAppendTo, FieldPosition pos) {
        if (Math.abs(number) < 1e-300) {
            return toAppendTo.append('0');
        }
        // Only values with a unit get a prefix: format as volts, then leave the symbol to the axis label.
        String volts = Si.format(number, Unit.VOLT, 3);
        return toAppendTo.append(volts.endsWith(Unit.VOLT.symbol())
                ? volts.substring(0, volts.length() - Unit.VOLT.symbol().length()).strip() : volts);
    }

    @Override
    public StringBuffer format(long number, StringBuffer toAppendTo, FieldPosition pos) {
        return format((double) number, toAppendTo, pos);
    }

    @Override
    public Number parse(String source, ParsePosition parsePosition) {
        return null;
    }
}
