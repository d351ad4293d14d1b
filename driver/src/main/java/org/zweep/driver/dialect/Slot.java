package org.zweep.driver.dialect;

/**
 * A placeholder a command template may hold, such as {@code {frequency}}.
 *
 * @param name the name written between the braces
 * @param unit the SI unit the value is held in ({@code Hz}, {@code V}, {@code A}, {@code s},
 *     {@code ohm}), or empty for a plain count sent as NR1
 * @param list whether the value is a comma-separated list of numbers
 */
record Slot(String name, String unit, boolean list) {
    static Slot number(String name, String unit) {
        return new Slot(name, unit, false);
    }

    static Slot numbers(String name, String unit) {
        return new Slot(name, unit, true);
    }

    static Slot count(String name) {
        return new Slot(name, "", false);
    }
}
