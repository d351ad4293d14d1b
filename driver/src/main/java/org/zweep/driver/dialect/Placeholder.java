package org.zweep.driver.dialect;

/**
 * A placeholder a command template may hold, such as {@code {frequency}}.
 *
 * @param name the name written between the braces
 * @param unit the SI unit the value is held in ({@code Hz}, {@code V}, {@code A}, {@code s},
 *     {@code ohm}), or empty for a plain count sent as NR1
 * @param list whether the value is a comma-separated list of numbers
 */
record Placeholder(String name, String unit, boolean list) {
    static Placeholder number(String name, String unit) {
        return new Placeholder(name, unit, false);
    }

    static Placeholder numbers(String name, String unit) {
        return new Placeholder(name, unit, true);
    }

    static Placeholder count(String name) {
        return new Placeholder(name, "", false);
    }
}
