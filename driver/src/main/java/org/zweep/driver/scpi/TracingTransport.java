package org.zweep.driver.scpi;

import org.zweep.driver.transport.Transport;

/** Logs every chunk that passes through a transport to a {@link TrafficTrace}. */
final class TracingTransport implements Transport {
    private final Transport inner;
    private final TrafficTrace trace;

    TracingTransport(Transport inner, TrafficTrace trace) {
        this.inner = inner;
        this.trace = trace;
    }

    @Override
    public String name() {
        return inner.name();
    }

    @Override
    public void write(byte[] data, int offset, int length) {
        trace.sent(data, offset, length);
        inner.write(data, offset, length);
    }

    @Override
    public int read(byte[] buffer, int offset, int length, long timeoutMillis) {
        int n = inner.read(buffer, offset, length, timeoutMillis);
        if (n > 0) {
            trace.received(buffer, offset, n);
        }
        return n;
    }

    @Override
    public void close() {
        try {
            inner.close();
        } finally {
            trace.close();
        }
    }
}
