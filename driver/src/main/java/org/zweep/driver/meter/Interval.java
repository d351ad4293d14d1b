package org.zweep.driver.meter;

/**
 * A closed interval of a physical quantity, in the SI unit its user names.
 *
 * @param min the lower limit
 * @param max the upper limit (at least {@code min})
 */
public record Interval(double min, double max) {
    /** Whether {@code value} lies within the interval, limits included. */
    public boolean contains(double value) {
        return value >= min && value <= max;
    }
}
