package org.zweep.runner.cli;

import java.math.BigDecimal;
import java.math.RoundingMode;
import java.time.Duration;
import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import picocli.CommandLine;

/**
 * The one reader of every duration option ({@code --timeout}, {@code --reconnect-budget},
 * {@code --settle}, {@code sim}'s {@code --delay} and {@code --drop-idle}): {@code 500ms},
 * {@code 2s}, {@code 1.5s}, {@code 1min}, or a bare number of seconds ({@code 2}, {@code 0.5}).
 * Zero is accepted (an option that needs more says so itself); a negative number or another
 * unit is refused with one line naming the forms.
 */
final class DurationConverter implements CommandLine.ITypeConverter<Duration> {
    private static final Pattern FORM = Pattern.compile("(\\d+(?:\\.\\d+)?|\\.\\d+)\\s*(ms|s|min)?");

    @Override
    public Duration convert(String value) {
        Matcher m = FORM.matcher(value.strip().toLowerCase(Locale.ROOT));
        if (!m.matches()) {
            throw new CommandLine.TypeConversionException("'" + value
                    + "' is not a duration: give e.g. 500ms, 2s, 1min or a number of seconds");
        }
        BigDecimal n = new BigDecimal(m.group(1));
        String unit = m.group(2) == null ? "s" : m.group(2);
        BigDecimal millis = switch (unit) {
            case "ms" -> n;
            case "s" -> n.movePointRight(3);
            default -> n.multiply(BigDecimal.valueOf(60_000));
        };
        if (millis.compareTo(BigDecimal.valueOf(Long.MAX_VALUE / 2)) > 0) {
            throw new CommandLine.TypeConversionException("'" + value + "' is too long a duration");
        }
        return Duration.ofMillis(millis.setScale(0, RoundingMode.CEILING).longValueExact());
    }

    /** {@code d} the way it is typed: {@code 1min}, {@code 10s}, {@code 500ms} (for defaults in the help). */
    static String text(Duration d) {
        long ms = d.toMillis();
        if (ms >= 60_000 && ms % 60_000 == 0) {
            return ms / 60_000 + "min";
        }
        return ms % 1000 == 0 ? ms / 1000 + "s" : ms + "ms";
    }
}
