package org.zweep.simulator.server;

import java.time.Duration;
import java.util.EnumSet;
import java.util.Set;

/** One misbehaviour of the simulated meter's connection; see {@link ScheduledFault} for when. */
public sealed interface Fault {

    /** The phases this fault can be attached to. */
    Set<Phase> phases();

    /** Closes the connection (before the reply at RECEIVE/REPLY, after it at COMPLETE). */
    record Drop() implements Fault {
        @Override
        public Set<Phase> phases() {
            return EnumSet.of(Phase.RECEIVE, Phase.REPLY, Phase.COMPLETE);
        }
    }

    /** Closes the connection when no message arrives for {@code idle}. */
    record DropWhenIdle(Duration idle) implements Fault {
        public DropWhenIdle {
            if (idle.isNegative() || idle.isZero()) {
                throw new IllegalArgumentException("idle time must be positive, got " + idle);
            }
        }

        @Override
        public Set<Phase> phases() {
            return EnumSet.of(Phase.IDLE);
        }
    }

    /** Holds the reply back for {@code delay} (longer than a client's timeout makes a late reply). */
    record Delay(Duration delay) implements Fault {
        public Delay {
            if (delay.isNegative()) {
                throw new IllegalArgumentException("delay must not be negative, got " + delay);
            }
        }

        @Override
        public Set<Phase> phases() {
            return EnumSet.of(Phase.REPLY);
        }
    }

    /** Sends the reply in pieces of {@code bytes} bytes, {@code gap} apart. */
    record Fragment(int bytes, Duration gap) implements Fault {
        public Fragment {
            if (bytes < 1) {
                throw new IllegalArgumentException("fragment size must be at least 1 byte, got " + bytes);
            }
        }

        @Override
        public Set<Phase> phases() {
            return EnumSet.of(Phase.REPLY);
        }
    }

    /** Never answers again: the connection stays open, input is read and ignored. */
    record Stall() implements Fault {
        @Override
        public Set<Phase> phases() {
            return EnumSet.of(Phase.RECEIVE, Phase.REPLY);
        }
    }

    /** Sends the reply without its LF terminator. */
    record OmitTerminator() implements Fault {
        @Override
        public Set<Phase> phases() {
            return EnumSet.of(Phase.REPLY);
        }
    }

    /** Puts {@code code,"text"} into the instrument's error queue (before the message runs). */
    record PushError(int code, String text) implements Fault {
        @Override
        public Set<Phase> phases() {
            return EnumSet.of(Phase.RECEIVE);
        }
    }

    /**
     * Replaces some printable characters of the reply by others (the terminator is kept), drawn
     * from {@code seed} and the reply number.
     */
    record Garble(long seed) implements Fault {
        @Override
        public Set<Phase> phases() {
            return EnumSet.of(Phase.REPLY);
        }
    }
}
