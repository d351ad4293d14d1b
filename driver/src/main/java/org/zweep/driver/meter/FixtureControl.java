package org.zweep.driver.meter;

import java.util.Set;

/** A fixture the meter switches itself, on command (a motorised fixture or a handler). */
public interface FixtureControl {

    /** The states this fixture can be switched to. */
    Set<FixtureState> states();

    /**
     * Brings the fixture to {@code state} and returns when it is there.
     *
     * @throws IllegalArgumentException when {@code state} is not in {@link #states()}
     */
    void hold(FixtureState state);
}
