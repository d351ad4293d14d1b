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
    private final boolean realTiming;
    private volatile long seed;

    /**
     * Reads the simulator's timing and seed now, each until two reads agree, so that a reply
     * corrupted on the way is neither taken for the wrong timing nor fails as a bad number.
     *
     * @throws ScpiProtocolException when no two of four reads agree
     */
    ScpiSimulatorControl(JoiningSession session) {
        this.session = session;
        this.realTiming = agreed(":SIM:TIM?").toUpperCase(Locale.ROOT).startsWith("REAL");
        String s = agreed(":SIM:SEED?");
        try {
            long parsed = Long.parseLong(s);
            this.seed = parsed;
        } catch (NumberFormatException e) {
            throw new org.zweep.driver.scpi.ScpiProtocolException(session.address() + ": the simulator's seed '" + s
                    + "' is not a whole number");
        }
    }

    private String agreed(String query) {
        java.util.List<String> seen = new java.util.ArrayList<>();
        for (int i = 0; i < 4; i++) {
            String r = session.query(query).trim();
            if (seen.contains(r)) {
                return r;
            }
            seen.add(r);
        }
        throw new org.zweep.driver.scpi.ScpiProtocolException(session.address() + ": " + seen.size()
                + " different replies to '" + query + "' (replies corrupted on the way)");
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

    /** The simulated fixture as the meter's own ({@code :SIM:FIXT}, {@code :SIM:SEC}). */
    org.zweep.driver.meter.FixtureControl fixture() {
        return new org.zweep.driver.meter.FixtureControl() {
            @Override
            public java.util.Set<org.zweep.driver.meter.FixtureState> states() {
                return java.util.EnumSet.allOf(org.zweep.driver.meter.FixtureState.class);
            }

            @Override
            public void hold(org.zweep.driver.meter.FixtureState state) {
                switch (state) {
                    case PART -> setSlot(Slot.DEVICE);
                    case OPEN -> setSlot(Slot.OPEN);
                    case SHORT -> setSlot(Slot.SHORT);
                    case LOAD -> setSlot(Slot.LOAD);
                    case SECONDARY_OPEN -> setWiring(Wiring.SECONDARY_OPEN);
                    case SECONDARY_SHORTED -> setWiring(Wiring.SECONDARY_SHORTED);
                }
            }
        };
    }

    @Override
    public void setNoiseKey(long key) {
        session.joinNext(":SIM:NOIS:KEY " + key);
    }

    @Override
    public void setSeed(long seed) {
        session.write(":SIM:SEED " + seed);
        this.seed = seed;
    }

    @Override
    public boolean realTiming() {
        return realTiming;
    }

    @Override
    public long seed() {
        return seed;
    }
}
