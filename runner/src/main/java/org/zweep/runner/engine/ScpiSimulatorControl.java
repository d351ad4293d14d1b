package org.zweep.runner.engine;

import java.util.Locale;
import org.zweep.driver.meter.MeterIdentity;
import org.zweep.runner.plan.Wiring;

/**
 * {@link SimulatorControl} through the simulator's {@code SIMulate} subsystem over any SCPI session.
 * The noise key travels in front of the next message (the trigger's), not as a write of its own.
 */
final class ScpiSimulatorControl implements SimulatorControl {
    /** The simulator's {@code *IDN?} manufacturer field. */
    static final String MANUFACTURER = "Korvane Bench Instruments";

    private final JoiningSession session;

    ScpiSimulatorControl(JoiningSession session) {
        this.session = session;
    }

    /** Whether {@code id} is the zweep simulator's identity (in-process or over TCP alike). */
    static boolean isSimulator(MeterIdentity id) {
        return MANUFACTURER.equals(id.manufacturer()) && id.model().toLowerCase(Locale.ROOT).contains("simulator");
    }

    @Override
    public void setSlot(Slot slot) {
        session.write(":SIM:FIXT " + switch (slot) {
            case OPEN -> "OPEN";
            case SHORT -> "SHOR";
            case LOAD -> "LOAD";
            case DEVICE -> "DEV";
        });
    }

    @Override
    public void setWiring(Wiring wiring) {
        if (wiring != Wiring.NONE) {
            session.write(":SIM:SEC " + (wiring == Wiring.SECONDARY_OPEN ? "OPEN" : "SHOR"));
        }
    }

    @Override
    public void setNoiseKey(long key) {
        session.joinNext(":SIM:NOIS:KEY " + key);
    }

    @Override
    public void setSeed(long seed) {
        session.write(":SIM:SEED " + seed);
    }

    @Override
    public boolean realTiming() {
        return session.query(":SIM:TIM?").trim().toUpperCase(Locale.ROOT).startsWith("REAL");
    }

    @Override
    public long seed() {
        return Long.parseLong(session.query(":SIM:SEED?").trim());
    }
}
