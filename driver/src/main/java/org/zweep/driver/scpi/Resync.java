package org.zweep.driver.scpi;

/**
 * How the client gets back in step after a timeout or a broken reply, before the next command, so
 * that a late answer is never taken for the answer to a new query.
 */
public enum Resync {
    /**
     * Discard whatever arrives until the link has been quiet for the drain-quiet time (a meter that
     * is still sending after ten read timeouts is a {@link ScpiProtocolException}).
     */
    DRAIN,
    /**
     * Drain as above, then send {@code *OPC?} and discard every reply line up to its {@code 1}:
     * the meter answers in order, so a slow late reply is caught too (IEEE 488.2 §12.5.3).
     */
    OPC
}
