package org.zweep.simulator.scpi;

import java.util.Locale;

/** One program data element of a message unit (IEEE 488.2 §7.7). */
public sealed interface Param {

    /**
     * Decimal or non-decimal numeric data (§7.7.2, §7.7.4) with its suffix (§7.7.3).
     *
     * @param value the number as written, before any suffix multiplier
     * @param suffix the suffix in upper case, or the empty string when there is none
     */
    record Decimal(double value, String suffix) implements Param {
    }

    /** Character program data (§7.7.1), e.g. {@code ON}, {@code MAX}; {@code text} is upper case. */
    record Chars(String text) implements Param {
        /** Whether this is exactly the long or the short form of {@code mnemonic} (e.g. {@code MAXimum}). */
        public boolean is(String mnemonic) {
            return Mnemonics.matches(mnemonic, text);
        }
    }

    /** String program data (§7.7.5) with the quotes removed and doubled quotes undone. */
    record Str(String value) implements Param {
    }

    /** Arbitrary block program data (§7.7.6). */
    record Block(byte[] bytes) implements Param {
    }

    /** How the element is named in a message: the type, for {@code -104} details. */
    default String typeName() {
        if (this instanceof Decimal) {
            return "numeric";
        }
        if (this instanceof Chars) {
            return "character";
        }
        if (this instanceof Str) {
            return "string";
        }
        return "block";
    }

    /** Upper-cases ASCII text the way SCPI compares mnemonics. */
    static String upper(String s) {
        return s.toUpperCase(Locale.ROOT);
    }
}
