package org.zweep.runner.sim;

import java.util.EnumSet;
import java.util.Set;
import org.zweep.driver.meter.FixtureControl;
import org.zweep.driver.meter.FixtureState;
import org.zweep.driver.scpi.ScpiSession;

/**
 * The simulator's fixture through its own {@code SIMulate:FIXTure} and {@code SIMulate:SECondary}
 * commands, for a dialect that declares no fixture of its own. Each switch waits for the
 * simulator to confirm ({@code *OPC?}).
 */
final class SimulatorFixture implements FixtureControl {
    private final ScpiSession session;

    SimulatorFixture(ScpiSession session) {
        this.session = session;
    }

    @Override
    public Set<FixtureState> states() {
        return EnumSet.allOf(FixtureState.class);
    }

    @Override
    public void hold(FixtureState state) {
        session.query(switch (state) {
            case PART -> ":SIM:FIXT DEV";
            case OPEN -> ":SIM:FIXT OPEN";
            case SHORT -> ":SIM:FIXT SHOR";
            case LOAD -> ":SIM:FIXT LOAD";
            case SECONDARY_OPEN -> ":SIM:SEC OPEN";
            case SECONDARY_SHORTED -> ":SIM:SEC SHOR";
        } + ";*OPC?");
    }
}
