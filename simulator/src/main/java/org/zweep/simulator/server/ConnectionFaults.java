package org.zweep.simulator.server;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;

/** One connection's faults with their selection state. Used by the connection's threads under its lock. */
final class ConnectionFaults {
    private record Active(ScheduledFault fault, Random random) {
    }

    private final List<Active> active = new ArrayList<>();

    ConnectionFaults(FaultPlan plan) {
        plan.faults().forEach(this::add);
    }

    synchronized void add(ScheduledFault f) {
        Random r = f.when() instanceof Exchanges.Random x ? new Random(x.seed()) : null;
        active.add(new Active(f, r));
    }

    synchronized void clear() {
        active.clear();
    }

    synchronized void removeIdle() {
        active.removeIf(a -> a.fault().phase() == Phase.IDLE);
    }

    /** The faults acting at {@code phase} of exchange {@code n} (a reply number for REPLY), in order. */
    synchronized List<Fault> at(Phase phase, long n) {
        List<Fault> out = List.of();
        for (Active a : active) {
            if (a.fault().phase() != phase) {
                continue;
            }
            boolean hit;
            if (a.fault().when() instanceof Exchanges.Range r) {
                hit = r.contains(n);
            } else {
                hit = a.random().nextDouble() < ((Exchanges.Random) a.fault().when()).probability();
            }
            if (hit) {
                if (out.isEmpty()) {
                    out = new ArrayList<>(2);
                }
                out.add(a.fault().fault());
            }
        }
        return out;
    }

    /** The shortest idle time after which the connection drops, or {@code null}. */
    synchronized Duration idleLimit() {
        Duration d = null;
        for (Active a : active) {
            if (a.fault().fault() instanceof Fault.DropWhenIdle w && (d == null || w.idle().compareTo(d) < 0)) {
                d = w.idle();
            }
        }
        return d;
    }
}
