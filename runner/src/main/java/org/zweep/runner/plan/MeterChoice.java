package org.zweep.runner.plan;

import org.zweep.driver.InvalidInputException;

/**
 * Which meter a run uses.
 *
 * <p>A sequence's own meter is checked only when it is used: a sequence copied away from its
 * bench file still loads, and runs with {@code --meter}; {@link #requireUsable()} refuses it when
 * nothing replaces it.
 *
 * @param address an address the driver accepts ({@code tcp://…}, {@code serial:…}, {@code sim:BENCH}, VISA strings)
 * @param dialect a built-in dialect name or a path to a dialect file
 * @param unusable why {@code address} cannot be used, one line starting with the sequence's
 *     {@code file:line:column}; {@code null} when it can
 */
public record MeterChoice(String address, String dialect, String unusable) {

    /** A choice whose address can be used. */
    public MeterChoice(String address, String dialect) {
        this(address, dialect, null);
    }

    /**
     * This choice when its address can be used.
     *
     * @throws InvalidInputException with {@link #unusable()} when it cannot
     */
    public MeterChoice requireUsable() {
        if (unusable != null) {
            throw new InvalidInputException(unusable);
        }
        return this;
    }

    /** The same address (and whatever keeps it from being used) with another dialect. */
    public MeterChoice withDialect(String d) {
        return new MeterChoice(address, d, unusable);
    }
}
