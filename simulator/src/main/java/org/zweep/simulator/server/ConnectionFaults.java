package org.zweep.simulator.server;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;

/** One connection's faults; thread-safe. */
final class ConnectionFaults {
    private final List<ScheduledFault> active = new ArrayList<>();

    ConnectionFaults(FaultPlan plan) {
        plan.faults().forEach(this::add);
    }

    synchronized void add(ScheduledFault f) {
        active.add(f);
    }

    synchronized void clear() {
        active.clear();
    }

    synchronized void removeIdle() {
        active.removeIf(a -> a.phase() == Phase.IDLE);
    }

    /** The faults acting at {@code phase} of exchange {@code n} (a reply number for REPLY), in order. */
    synchronized List<Fault> at(Phase phase, long n) {
        List<Fault> out = List.of();
        for (ScheduledFault a : active) {
            if (a.phase() == phase && a.when().contains(n)) {
                if (out.isEmpty()) {
                    out = new ArrayList<>(2);
                }
                out.add(a.fault());
            }
        }
        return out;
    }

    /** The shortest idle time after which the connection drops, or {@code null}. */
    synchronized Duration idleLimit() {
        Duration d = null;
        for (ScheduledFault a : active) {
            if (a.fault() instanceof Fault.DropWhenIdle w && (d == null || w.idle().compareTo(d) < 0)) {
                d = w.idle();
            }
        }
        return d;
    }
}
