package org.zweep.runner.cli;

import java.math.BigDecimal;
import java.time.Duration;
import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import picocli.CommandLine;

/**
 * Reads a positive duration with a unit: {@code 500ms}, {@code 2s}, {@code 1.5s}, {@code 2min}.
 * A bare number is refused, so that nobody has to guess the unit.
 */
final class DurationConverter implements CommandLine.ITypeConverter<Duration> {
    private static final Pattern FORM = Pattern.compile("(\\d+(?:\\.\\d+)?)\\s*(ms|s|min)");

    @Override
    public Duration convert(String value) {
        Matcher m = FORM.matcher(value.strip().toLowerCase(Locale.ROOT));
        if (!m.matches()) {
            throw new CommandLine.TypeConversionException("'" + value
                    + "' is not a duration with a unit, e.g. 500ms, 2s or 1min");
        }
        BigDecimal n = new BigDecimal(m.group(1));
        BigDecimal millis = switch (m.group(2)) {
            case "ms" -> n;
            case "s" -> n.movePointRight(3);
            default -> n.multiply(BigDecimal.valueOf(60_000));
        };
        long ms = millis.setScale(0, java.math.RoundingMode.CEILING).longValueExact();
        if (ms <= 0) {
            throw new CommandLine.TypeConversionException("'" + value + "' must be longer than zero");
        }
        return Duration.ofMillis(ms);
    }
}
