package org.zweep.simulator.server;

/**
 * Where in one exchange (one program message and its reply) a fault acts. Exchanges are numbered
 * from 1 per connection; for {@link #REPLY} the number counts replies only, so "the 3rd reply" is
 * the reply to the 3rd message that had one.
 */
public enum Phase {
    /** A message has been received and is about to be executed. */
    RECEIVE,
    /** A reply is about to be sent. */
    REPLY,
    /** The exchange is finished (its reply, if any, was handed to the connection). */
    COMPLETE,
    /** Between exchanges, while the connection waits for input. */
    IDLE
}
