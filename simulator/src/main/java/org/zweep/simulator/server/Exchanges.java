package org.zweep.simulator.server;

/** Which exchanges of a connection a {@link ScheduledFault} applies to (numbered from 1). */
public sealed interface Exchanges {

    /** Every exchange. */
    static Exchanges every() {
        return new Range(1, Long.MAX_VALUE);
    }

    /** Only exchange {@code n}. */
    static Exchanges nth(long n) {
        return new Range(n, 1);
    }

    /** Exchange {@code first} and every one after it. */
    static Exchanges from(long first) {
        return new Range(first, Long.MAX_VALUE);
    }

    /** {@code count} exchanges from {@code first}. */
    record Range(long first, long count) implements Exchanges {
        public Range {
            if (first < 1 || count < 1) {
                throw new IllegalArgumentException("exchanges are numbered from 1; got first " + first + ", count " + count);
            }
        }

        boolean contains(long n) {
            return n >= first && n - first < count;
        }
    }

    /** Each exchange with {@code probability}, drawn from {@code seed} (the same per connection). */
    record Random(double probability, long seed) implements Exchanges {
        public Random {
            if (!(probability >= 0 && probability <= 1)) {
                throw new IllegalArgumentException("probability must be in [0, 1], got " + probability);
            }
        }
    }
}
