package org.zweep.simulator.server;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.util.List;
import org.junit.jupiter.api.Test;

/** The text form of fault plans and how faults select exchanges. */
class FaultPlanTest {

    @Test
    void eachKindParsesToItsFaultAndPhase() {
        FaultPlan p = FaultPlan.parse("drop@5, drop-idle=1.5, drop-random=0.25, delay=2@3, fragment=4@2+,"
                + " stall@7, omit-terminator@~0.5, error=-350@2, garble", 9);
        List<ScheduledFault> f = p.faults();
        // 1.5 s = 1500 ms, seed 9; -350 "Queue overflow" is SCPI-1999 Vol 2 §21.8.11
        assertEquals(new ScheduledFault(Phase.COMPLETE, Exchanges.nth(5), new Fault.Drop()), f.get(0));
        assertEquals(new ScheduledFault(Phase.IDLE, Exchanges.every(), new Fault.DropWhenIdle(Duration.ofMillis(1500))), f.get(1));
        assertEquals(new ScheduledFault(Phase.RECEIVE, new Exchanges.Random(0.25, 9), new Fault.Drop()), f.get(2));
        assertEquals(new ScheduledFault(Phase.REPLY, Exchanges.nth(3), new Fault.Delay(Duration.ofSeconds(2))), f.get(3));
        assertEquals(new ScheduledFault(Phase.REPLY, Exchanges.from(2), new Fault.Fragment(4, FaultPlan.FRAGMENT_GAP)), f.get(4));
        assertEquals(new ScheduledFault(Phase.RECEIVE, Exchanges.nth(7), new Fault.Stall()), f.get(5));
        assertEquals(new ScheduledFault(Phase.REPLY, new Exchanges.Random(0.5, 9), new Fault.OmitTerminator()), f.get(6));
        assertEquals(new ScheduledFault(Phase.RECEIVE, Exchanges.nth(2), new Fault.PushError(-350, "Queue overflow")), f.get(7));
        assertEquals(new ScheduledFault(Phase.REPLY, Exchanges.every(), new Fault.Garble(9)), f.get(8));
    }

    @Test
    void aBadItemIsNamedInTheMessage() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> FaultPlan.parse("delay=x@2", 0));
        assertTrue(e.getMessage().contains("'delay=x@2'"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> FaultPlan.parse("explode", 0));
        assertThrows(IllegalArgumentException.class, () -> FaultPlan.parse("drop-idle=1@3", 0));
    }

    @Test
    void aFaultCannotBeAttachedToAPhaseItDoesNotActIn() {
        assertThrows(IllegalArgumentException.class,
                () -> new ScheduledFault(Phase.RECEIVE, Exchanges.every(), new Fault.Delay(Duration.ZERO)));
    }

    @Test
    void aSeededRandomDrawIsTheSameForTheSameConnectionNumber() {
        FaultPlan plan = FaultPlan.parse("delay=1@2+,garble@~0.5", 42);
        ConnectionFaults a = new ConnectionFaults(plan, 3);
        ConnectionFaults b = new ConnectionFaults(plan, 3);
        // "delay=1@2+": none at exchange 1, one from exchange 2 on; arithmetic from the inputs above
        assertEquals(0, a.at(Phase.REPLY, 1).stream().filter(x -> x instanceof Fault.Delay).count());
        assertEquals(1, a.at(Phase.REPLY, 2).stream().filter(x -> x instanceof Fault.Delay).count());
        StringBuilder sa = new StringBuilder();
        StringBuilder sb = new StringBuilder();
        for (int i = 3; i < 40; i++) {
            sa.append(a.at(Phase.REPLY, i).size());
        }
        for (int i = 3; i < 40; i++) {
            sb.append(b.at(Phase.REPLY, i).size());
        }
        assertEquals(sa.toString(), sb.toString()); // the same seed and connection pick the same exchanges
        assertTrue(sa.toString().contains("1") && sa.toString().contains("2"), sa.toString());
    }

    @Test
    void aReconnectIsANewDrawOfTheRandomFaults() {
        // issue 17, item 3: every reconnect met the same fault again at the same exchange
        FaultPlan plan = FaultPlan.parse("drop-random=0.1,garble@~0.1", 42);
        java.util.Set<String> draws = new java.util.HashSet<>();
        java.util.Set<Long> garbleSeeds = new java.util.HashSet<>();
        for (long connection = 1; connection <= 5; connection++) {
            ConnectionFaults f = new ConnectionFaults(plan, connection);
            StringBuilder s = new StringBuilder();
            for (int n = 1; n <= 200; n++) {
                s.append(f.at(Phase.RECEIVE, n).size());
            }
            draws.add(s.toString());
            f.at(Phase.REPLY, Long.MAX_VALUE - 1).size();
            for (int n = 1; n <= 200; n++) {
                for (Fault x : f.at(Phase.REPLY, n)) {
                    garbleSeeds.add(((Fault.Garble) x).seed());
                }
            }
        }
        assertEquals(5, draws.size(), "five connections, five different draws");
        assertEquals(5, garbleSeeds.size(), "each connection garbles with its own seed");
    }
}
