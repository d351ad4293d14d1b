package org.zweep.simulator.server;

import java.time.Duration;
import org.zweep.simulator.scpi.Call;
import org.zweep.simulator.scpi.CommandTree;
import org.zweep.simulator.scpi.ScpiException;
import org.zweep.simulator.scpi.StandardError;
import org.zweep.simulator.scpi.SuffixUnit;

/**
 * {@code SIMulate:FAULt}: faults for the connection that sends them, counted from the message
 * that sets them. See README, section "simulator (zweep sim)".
 */
final class FaultCommands {
    private static final double MAX_SECONDS = 1e6;
    private static final long MAX_COUNT = 1_000_000_000L;
    /** The shortest idle time a connection can be dropped after (the socket timeout's grain). */
    private static final double MIN_IDLE_SECONDS = 1e-3;

    private FaultCommands() {
    }

    private static ClientConnection conn(Call c) {
        return c.session().attachment(ClientConnection.class);
    }

    private static long count(Call c, int i) {
        return c.params().size() > i ? c.integer(i, 1, MAX_COUNT, 1) : 1;
    }

    static void register(CommandTree.Builder b) {
        b.on("SIMulate:FAULt:DROP[:AFTer]", c -> {
            c.count(1, 1);
            ClientConnection k = conn(c);
            long n = c.integer(0, 0, MAX_COUNT, 0);
            k.faults().add(new ScheduledFault(Phase.COMPLETE, Exchanges.nth(k.messageNumber() + n), new Fault.Drop()));
            return null;
        });
        b.on("SIMulate:FAULt:DROP:IDLE", c -> {
            c.count(1, 1);
            double s = c.number(0, SuffixUnit.SECOND, 0, MAX_SECONDS, 0);
            if (s > 0 && s < MIN_IDLE_SECONDS) {
                throw new ScpiException(StandardError.DATA_OUT_OF_RANGE,
                        "idle time " + s + " s is below 1 ms (0 turns the fault off)");
            }
            ClientConnection k = conn(c);
            k.faults().removeIdle();
            if (s > 0) {
                k.faults().add(new ScheduledFault(Phase.IDLE, Exchanges.every(),
                        new Fault.DropWhenIdle(Duration.ofNanos(Math.round(s * 1e9)))));
            }
            return null;
        });
        b.on("SIMulate:FAULt:DROP:RANDom", c -> {
            c.count(1, 2);
            double p = c.number(0, SuffixUnit.NONE, 0, 1, 0);
            long seed = c.params().size() > 1 ? c.integer(1, -(1L << 53), 1L << 53, 0) : c.session().instrument().bench().seed();
            ConnectionFaults f = conn(c).faults();
            f.add(f.drawnHere(new ScheduledFault(Phase.RECEIVE, new Exchanges.Random(p, seed), new Fault.Drop())));
            return null;
        });
        b.on("SIMulate:FAULt:DELay", c -> {
            c.count(1, 2);
            double s = c.number(0, SuffixUnit.SECOND, 0, MAX_SECONDS, 0);
            nextReplies(c, 1, new Fault.Delay(Duration.ofNanos(Math.round(s * 1e9))));
            return null;
        });
        b.on("SIMulate:FAULt:FRAGment", c -> {
            c.count(1, 2);
            int bytes = (int) c.integer(0, 1, 1 << 20, 1);
            nextReplies(c, 1, new Fault.Fragment(bytes, FaultPlan.FRAGMENT_GAP));
            return null;
        });
        b.on("SIMulate:FAULt:TERMinator:OMIT", c -> {
            c.count(0, 1);
            nextReplies(c, 0, new Fault.OmitTerminator());
            return null;
        });
        b.on("SIMulate:FAULt:GARBle", c -> {
            c.count(0, 1);
            nextReplies(c, 0, new Fault.Garble(conn(c).faults().seed(c.session().instrument().bench().seed())));
            return null;
        });
        b.on("SIMulate:FAULt:STALl", c -> {
            c.count(0, 0);
            ClientConnection k = conn(c);
            k.faults().add(new ScheduledFault(Phase.RECEIVE, Exchanges.from(k.messageNumber() + 1), new Fault.Stall()));
            return null;
        });
        b.on("SIMulate:FAULt:ERRor", c -> {
            c.count(1, 2);
            int code = (int) c.integer(0, -32768, 32767, 0);
            if (code == 0) {
                throw new ScpiException(StandardError.ILLEGAL_PARAMETER_VALUE, "0 is \"No error\"");
            }
            StandardError std = StandardError.of(code);
            String text = c.params().size() > 1 ? c.string(1) : std != null ? std.text() : "Injected fault";
            c.session().report(code, text);
            return null;
        });
        b.on("SIMulate:FAULt:CLEar", c -> {
            c.count(0, 0);
            conn(c).faults().clear();
            return null;
        });
    }

    /** Attaches {@code f} to the next replies; the count is parameter {@code countIndex}. */
    private static void nextReplies(Call c, int countIndex, Fault f) {
        ClientConnection k = conn(c);
        long n = count(c, countIndex);
        k.faults().add(new ScheduledFault(Phase.REPLY, new Exchanges.Span(k.replyNumber() + 1, n), f));
    }
}
