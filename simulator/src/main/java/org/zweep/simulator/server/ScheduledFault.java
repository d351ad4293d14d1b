package org.zweep.simulator.server;

/**
 * A fault attached to a phase of some exchanges, e.g. {@code (REPLY, nth(3), Delay(2 s))}: the
 * reply to the third query arrives two seconds late.
 */
public record ScheduledFault(Phase phase, Exchanges when, Fault fault) {
    public ScheduledFault {
        if (!fault.phases().contains(phase)) {
            throw new IllegalArgumentException(fault.getClass().getSimpleName() + " cannot act at " + phase
                    + "; it acts at " + fault.phases());
        }
    }
}
