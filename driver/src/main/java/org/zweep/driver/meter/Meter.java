package org.zweep.driver.meter;

import java.util.List;
import org.zweep.driver.impedance.Impedance;

/**
 * An impedance meter, as the runner and user scripts drive it.
 *
 * <p>Implementations talk to one instrument over one connection and are not required to be
 * thread-safe beyond what they document: one thread drives a meter at a time. Every method may
 * throw {@link org.zweep.driver.MeterException} (link broken, timeout, protocol error, or an error
 * the meter reported) and blocks until the meter has answered or the operation timed out.
 */
public interface Meter extends AutoCloseable {

    /** The meter's {@code *IDN?} identity. */
    MeterIdentity identify();

    /** Puts the meter into its reset state (bias off, default settings). */
    void reset();

    /** What the meter can do. */
    MeterCapabilities capabilities();

    /**
     * The capabilities with each range the meter itself states (its answers to the minimum and
     * maximum queries, where the dialect declares them) in place of the dialect's; the dialect's
     * elsewhere. Blocking: one query per declared limit. The default asks nothing.
     */
    default MeterCapabilities statedLimits() {
        return capabilities();
    }

    /**
     * The DC bias the meter says it applies now (after a reconnect: what the link's loss left on),
     * or empty when the meter cannot be asked. Blocking. The default asks nothing.
     */
    default java.util.Optional<Bias> readBias() {
        return java.util.Optional.empty();
    }

    /**
     * Makes {@code setting} the meter's current setting, sending only what differs from the
     * setting last applied through this object.
     */
    void apply(MeasurementSetting setting);

    /** Triggers one measurement at the current setting and returns its reading. */
    Reading measure();

    /**
     * {@link #apply} then {@link #measure}: for a point measured at once after its setting (no
     * settling wait between them). A meter that takes the setting and the trigger in one message
     * sends them so, one round trip; the default sends them one after the other.
     */
    default Reading measureAt(MeasurementSetting setting) {
        apply(setting);
        return measure();
    }

    /**
     * Measures {@code settings} in order and returns one reading per setting. When the meter
     * can sweep a list and the settings differ only in frequency (and, where declared, level or
     * bias), the list is one trigger and one read; otherwise point by point.
     */
    List<Reading> measureList(List<MeasurementSetting> settings);

    /** Tells the meter to acquire a fixture-correction standard now inserted in the fixture. */
    void acquireCorrection(CorrectionStandard standard);

    /**
     * Acquires {@code standard}, now fitted to the fixture, at each of {@code settings} in turn: what
     * a meter whose correction holds only at the frequency it was acquired at
     * ({@link CorrectionStyle#AT_ACQUIRED_FREQUENCY}) needs for a sweep. The default applies each
     * setting and acquires there, point by point; a meter that takes a list of frequencies in one
     * message does so. Afterwards the meter's setting is not known: apply one before measuring.
     */
    default void acquireCorrection(CorrectionStandard standard, List<MeasurementSetting> settings) {
        for (MeasurementSetting s : settings) {
            apply(s);
            acquireCorrection(standard);
        }
    }

    /** Tells the meter the known impedance of its load standard (used by {@link CorrectionStandard#LOAD}). */
    void setLoadStandard(Impedance known);

    /** Switches the meter's own fixture correction on or off. */
    void setCorrectionEnabled(boolean enabled);

    /**
     * What the meter itself can switch in its fixture (a motorised fixture or a handler the
     * meter's dialect declares), or empty when an operator or a hook must do it. The default is empty.
     */
    default java.util.Optional<FixtureControl> fixture() {
        return java.util.Optional.empty();
    }

    /** Switches DC bias off now. Safe to call at any time, also when bias is already off. */
    void biasOff();

    /**
     * Safe shutdown: turns DC bias off first, then releases the connection. Never throws; a
     * failure to turn bias off is reported through the returned flag's {@code false}.
     *
     * @return whether bias was confirmed off
     */
    boolean safeShutdown();

    /** Same as {@link #safeShutdown()}. */
    @Override
    void close();
}
