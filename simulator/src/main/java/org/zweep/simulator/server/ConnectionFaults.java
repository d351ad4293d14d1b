package org.zweep.simulator.server;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;

/**
 * One connection's faults; thread-safe. Random faults are drawn from the plan's seed and the
 * connection's number, so a reconnect is a new draw, as on a real link.
 */
final class ConnectionFaults {
    private final List<ScheduledFault> active = new ArrayList<>();
    private final long connection;

    /**
     * @param plan the faults the connection starts with
     * @param connection the connection's number (1, 2, ... in the order the server accepted them)
     */
    ConnectionFaults(FaultPlan plan, long connection) {
        this.connection = connection;
        plan.faults().forEach(f -> add(drawnHere(f)));
    }

    /** {@code f} with its random draw (exchanges picked, garbling) keyed to this connection. */
    ScheduledFault drawnHere(ScheduledFault f) {
        Exchanges when = f.when() instanceof Exchanges.Random r
                ? new Exchanges.Random(r.probability(), seed(r.seed())) : f.when();
        Fault fault = f.fault() instanceof Fault.Garble g ? new Fault.Garble(seed(g.seed())) : f.fault();
        return new ScheduledFault(f.phase(), when, fault);
    }

    /** A seed drawn from {@code seed} and this connection's number. */
    long seed(long seed) {
        return new SplittableRandom(seed ^ (connection * 0xD1B54A32D192ED03L)).nextLong();
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
