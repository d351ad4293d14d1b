package org.zweep.runner.text;

import java.time.Instant;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.time.format.DateTimeParseException;
import java.util.Locale;
import org.zweep.driver.impedance.Quantities;
import org.zweep.driver.impedance.Unit;

/**
 * Values for people, formatted one way everywhere (terminal, report, plots, messages): SI prefix,
 * at most a given number of significant digits with trailing zeros dropped ({@code 100 nF},
 * {@code 15.9 MHz}), "—" for a value that is not finite, and times to the second in UTC. The
 * number itself is written by the impedance core's {@link Quantities#formatShort}; the unit of a
 * named figure comes from {@link ParameterTable}. Stateless.
 */
public final class Figures {
    private static final DateTimeFormatter TIME = DateTimeFormatter
            .ofPattern("yyyy-MM-dd HH:mm:ss 'UTC'", Locale.ROOT).withZone(ZoneOffset.UTC);

    private Figures() {
    }

    /** {@code value} to at most 4 significant digits ({@code 1.5 kHz}); "—" when not finite. */
    public static String format(double value, Unit unit) {
        return format(value, unit, 4);
    }

    /** {@code value} to at most {@code digits} significant digits, trailing zeros dropped; "—" when not finite. */
    public static String format(double value, Unit unit, int digits) {
        return Double.isFinite(value) ? Quantities.formatShort(value, unit, digits) : "—";
    }

    /** A value of the figure named {@code key} ({@code esl_h}: henries), to at most {@code digits} digits. */
    public static String of(String key, double value, int digits) {
        return format(value, ParameterTable.unit(key), digits);
    }

    /** A value of the figure named {@code key}, to at most 4 digits. */
    public static String of(String key, double value) {
        return of(key, value, 4);
    }

    /** A plain number to at most {@code digits} significant digits ({@code 0.01199}); "—" when not finite. */
    public static String number(double value, int digits) {
        return format(value, Unit.NONE, digits);
    }

    /** A compact form for file names: no space, {@code u} for micro ({@code 10mA}, {@code 1V}, {@code 2.2uF}). */
    public static String compact(double value, Unit unit) {
        return format(value, unit, 6).replace(" ", "").replace("µ", "u");
    }

    /**
     * The unit a run folder names by its symbol ({@code V}, {@code A}, {@code F}, {@code Ω}, ...);
     * {@link Unit#NONE} for a symbol no unit has, so that the number is still shown.
     */
    public static Unit unit(String symbol) {
        return Unit.ofSymbol(symbol).orElse(Unit.NONE);
    }

    /** A time for people, to the second, in UTC: {@code 2026-12-03 08:09:58 UTC}; "—" for null. */
    public static String time(Instant t) {
        return t == null ? "—" : TIME.format(t);
    }

    /** {@link #time(Instant)} of an ISO-8601 instant text, or the text itself when it is not one; "—" for null. */
    public static String time(String iso) {
        if (iso == null) {
            return "—";
        }
        try {
            return time(Instant.parse(iso));
        } catch (DateTimeParseException e) {
            return iso;
        }
    }
}
