package org.zweep.runner.text;

import org.zweep.driver.impedance.Unit;

/**
 * A named figure: its machine name (a column, JSON or sequence key), its label for people and its unit.
 *
 * @param key the machine name, e.g. {@code esr_ohm}
 * @param label the label people read, e.g. {@code ESR}
 * @param unit the unit of its values ({@link Unit#NONE} for a plain number)
 */
public record Parameter(String key, String label, Unit unit) {
}
