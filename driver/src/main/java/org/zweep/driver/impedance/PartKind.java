package org.zweep.driver.impedance;

import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.Optional;

/**
 * The kind of component being measured. Its {@link #word() word} ({@code capacitor}, ...) is how
 * sequence files, {@code run.json} and the results index spell it.
 */
public enum PartKind {
    /** A capacitor: its main loss is usually dielectric leakage, across the part. */
    CAPACITOR,
    /** An inductor: its main loss is usually winding resistance, in series. */
    INDUCTOR,
    /** A resistor. */
    RESISTOR,
    /** A transformer, measured at its primary winding (an inductor as far as the winding goes). */
    TRANSFORMER;

    /** The kind's word in files: its name in lower case, e.g. {@code capacitor}. */
    public String word() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** The words of all kinds, in declaration order. */
    public static List<String> words() {
        return Arrays.stream(values()).map(PartKind::word).toList();
    }

    /** The kind whose {@link #word()} is {@code word} exactly; empty for any other text. */
    public static Optional<PartKind> ofWord(String word) {
        return Arrays.stream(values()).filter(k -> k.word().equals(word)).findFirst();
    }
}
