package org.zweep.simulator.server;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import org.zweep.simulator.scpi.StandardError;

/**
 * The faults every new connection starts with; each connection keeps its own counters, so a
 * plan never makes the server globally flaky.
 *
 * <p>Text form ({@link #parse}), items separated by commas, each {@code KIND[=VALUE][@WHEN]}:
 * <pre>
 *   drop@N               close the connection after the N-th message is answered
 *   drop-idle=SECONDS    close it when no message arrives for SECONDS
 *   drop-random=P        close it on receiving a message, with probability P per message
 *   delay=SECONDS@WHEN   hold replies back
 *   fragment=BYTES@WHEN  send replies in pieces of BYTES bytes, 2 ms apart
 *   stall@N              never answer from the N-th message on (the connection stays open)
 *   omit-terminator@WHEN send replies without their LF
 *   error=CODE@N         push CODE into the error queue on receiving the N-th message
 *   garble@WHEN          garble replies
 * </pre>
 * {@code WHEN} is {@code N} (only the N-th), {@code N+} (the N-th and later), {@code ~P} (each
 * with probability P) or absent (every one). Replies are counted for delay, fragment,
 * omit-terminator and garble; messages for the rest.
 */
public record FaultPlan(List<ScheduledFault> faults) {
    /** The gap between fragments of a fragmented reply. */
    public static final Duration FRAGMENT_GAP = Duration.ofMillis(2);

    public FaultPlan {
        faults = List.copyOf(faults);
    }

    /** No faults. */
    public static FaultPlan none() {
        return new FaultPlan(List.of());
    }

    /** A copy with {@code f} added. */
    public FaultPlan with(ScheduledFault f) {
        List<ScheduledFault> l = new ArrayList<>(faults);
        l.add(f);
        return new FaultPlan(l);
    }

    /** A copy with every fault of {@code other} added. */
    public FaultPlan with(FaultPlan other) {
        List<ScheduledFault> l = new ArrayList<>(faults);
        l.addAll(other.faults);
        return new FaultPlan(l);
    }

    /**
     * Parses the text form above; {@code seed} seeds random selection and garbling.
     *
     * @throws IllegalArgumentException naming the bad item
     */
    public static FaultPlan parse(String spec, long seed) {
        FaultPlan plan = none();
        if (spec.isBlank()) {
            return plan;
        }
        for (String raw : spec.split(",")) {
            String item = raw.strip();
            try {
                plan = plan.with(item(item, seed));
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException("fault '" + item + "': " + e.getMessage(), e);
            }
        }
        return plan;
    }

    private static ScheduledFault item(String item, long seed) {
        String when = null;
        int at = item.indexOf('@');
        String head = item;
        if (at >= 0) {
            when = item.substring(at + 1);
            head = item.substring(0, at);
        }
        String kind = head;
        String value = null;
        int eq = head.indexOf('=');
        if (eq >= 0) {
            kind = head.substring(0, eq);
            value = head.substring(eq + 1);
        }
        return switch (kind) {
            case "drop" -> new ScheduledFault(Phase.COMPLETE, when(when, seed), none(kind, value, new Fault.Drop()));
            case "drop-idle" -> {
                noWhen(kind, when);
                yield new ScheduledFault(Phase.IDLE, Exchanges.every(), new Fault.DropWhenIdle(seconds(kind, value)));
            }
            case "drop-random" -> {
                noWhen(kind, when);
                yield new ScheduledFault(Phase.RECEIVE, new Exchanges.Random(number(kind, value), seed), new Fault.Drop());
            }
            case "delay" -> new ScheduledFault(Phase.REPLY, when(when, seed), new Fault.Delay(seconds(kind, value)));
            case "fragment" -> new ScheduledFault(Phase.REPLY, when(when, seed),
                    new Fault.Fragment((int) number(kind, value), FRAGMENT_GAP));
            case "stall" -> new ScheduledFault(Phase.RECEIVE, when(when, seed), none(kind, value, new Fault.Stall()));
            case "omit-terminator" -> new ScheduledFault(Phase.REPLY, when(when, seed), none(kind, value, new Fault.OmitTerminator()));
            case "error" -> {
                int code = (int) number(kind, value);
                StandardError std = StandardError.of(code);
                yield new ScheduledFault(Phase.RECEIVE, when(when, seed),
                        new Fault.PushError(code, std != null ? std.text() : "Injected fault"));
            }
            case "garble" -> new ScheduledFault(Phase.REPLY, when(when, seed), none(kind, value, new Fault.Garble(seed)));
            default -> throw new IllegalArgumentException("unknown kind '" + kind
                    + "' (drop, drop-idle, drop-random, delay, fragment, stall, omit-terminator, error, garble)");
        };
    }

    private static Fault none(String kind, String value, Fault f) {
        if (value != null) {
            throw new IllegalArgumentException(kind + " takes no =VALUE");
        }
        return f;
    }

    private static void noWhen(String kind, String when) {
        if (when != null) {
            throw new IllegalArgumentException(kind + " takes no @WHEN");
        }
    }

    private static double number(String kind, String value) {
        if (value == null || value.isBlank()) {
            throw new IllegalArgumentException(kind + " needs =VALUE");
        }
        try {
            return Double.parseDouble(value);
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("'" + value + "' is not a number");
        }
    }

    private static Duration seconds(String kind, String value) {
        double s = number(kind, value);
        if (!(s >= 0) || s > 1e6) {
            throw new IllegalArgumentException("'" + value + "' is not a time in seconds");
        }
        return Duration.ofNanos(Math.round(s * 1e9));
    }

    private static Exchanges when(String when, long seed) {
        if (when == null || when.equals("*")) {
            return Exchanges.every();
        }
        try {
            if (when.startsWith("~")) {
                return new Exchanges.Random(Double.parseDouble(when.substring(1)), seed);
            }
            if (when.endsWith("+")) {
                return Exchanges.from(Long.parseLong(when.substring(0, when.length() - 1)));
            }
            return Exchanges.nth(Long.parseLong(when));
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("'@" + when + "' is not N, N+, ~P or *");
        }
    }
}
