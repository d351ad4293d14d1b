package org.zweep.driver.transport;

/**
 * Whether a transport's link is still usable: closed by its owner, or broken by a failure that
 * leaves the protocol out of step (every later use fails with the same reason). The one such
 * bookkeeping of the HiSLIP, VXI-11 and USBTMC transports. {@link #close()} and {@link #closed()}
 * are safe from any thread.
 */
public final class LinkState {
    private final String name;
    private volatile boolean closed;
    private volatile ConnectionLostException broken;

    /** @param name the link's address, the first words of every message */
    public LinkState(String name) {
        this.name = name;
    }

    /**
     * Throws if the link cannot be used for {@code what} (e.g. "write", "read the status byte").
     *
     * @throws ConnectionLostException if it was closed or broke
     */
    public void check(String what) {
        if (closed) {
            throw new ConnectionLostException(name + ": cannot " + what + ", the connection is closed");
        }
        ConnectionLostException b = broken;
        if (b != null) {
            throw new ConnectionLostException(b.getMessage(), b);
        }
    }

    /** Marks the link broken for {@code why}; returns the failure for the caller to throw (the caller closes the link). */
    public ConnectionLostException broke(String why) {
        ConnectionLostException b = new ConnectionLostException(name + ": " + why);
        broken = b;
        return b;
    }

    /** Whether a failure broke the link. */
    public boolean broken() {
        return broken != null;
    }

    /** Marks the link closed by its owner. */
    public void close() {
        closed = true;
    }

    /** Whether the owner closed the link. */
    public boolean closed() {
        return closed;
    }
}
