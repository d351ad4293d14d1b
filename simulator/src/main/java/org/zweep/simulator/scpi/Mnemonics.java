package org.zweep.simulator.scpi;

/** The SCPI-1999 Vol 1 §6.2.1 mnemonic rules: exact short or exact long form, any case. */
final class Mnemonics {
    /** Program mnemonics and character data are at most 12 characters (IEEE 488.2 §7.6.1.4.1). */
    static final int MAX_LENGTH = 12;

    private Mnemonics() {
    }

    /** The short form of a mnemonic written in documentation case: its upper-case letters. */
    static String shortForm(String documented) {
        StringBuilder b = new StringBuilder();
        for (int i = 0; i < documented.length(); i++) {
            char c = documented.charAt(i);
            if (Character.isUpperCase(c) || Character.isDigit(c)) {
                b.append(c);
            } else {
                break;
            }
        }
        return b.toString();
    }

    /** Whether {@code typedUpper} is exactly the short or the long form of {@code documented}. */
    static boolean matches(String documented, String typedUpper) {
        return typedUpper.equalsIgnoreCase(documented) || typedUpper.equalsIgnoreCase(shortForm(documented));
    }
}
