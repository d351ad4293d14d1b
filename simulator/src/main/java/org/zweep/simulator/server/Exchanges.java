package org.zweep.simulator.server;

/** Which exchanges of a connection a {@link ScheduledFault} applies to (numbered from 1). */
public sealed interface Exchanges {

    /** Whether exchange {@code n} (numbered from 1) is picked. */
    boolean contains(long n);

    /** Every exchange. */
    static Exchanges every() {
        return new Span(1, Long.MAX_VALUE);
    }

    /** Only exchange {@code n}. */
    static Exchanges nth(long n) {
        return new Span(n, 1);
    }

    /** Exchange {@code first} and every one after it. */
    static Exchanges from(long first) {
        return new Span(first, Long.MAX_VALUE);
    }

    /** {@code count} exchanges from {@code first}. */
    record Span(long first, long count) implements Exchanges {
        public Span {
            if (first < 1 || count < 1) {
                throw new IllegalArgumentException("exchanges are numbered from 1; got first " + first + ", count " + count);
            }
        }

        @Override
        public boolean contains(long n) {
            return n >= first && n - first < count;
        }
    }

    /**
     * Each exchange with {@code probability}; whether exchange n is picked depends only on
     * {@code seed} and n. A connection draws its own seed from the plan's seed and its number,
     * so each connection (a reconnect too) picks other exchanges.
     */
    record Random(double probability, long seed) implements Exchanges {
        public Random {
            if (!(probability >= 0 && probability <= 1)) {
                throw new IllegalArgumentException("probability must be in [0, 1], got " + probability);
            }
        }

        @Override
        public boolean contains(long n) {
            return new java.util.SplittableRandom(seed * 0x9E3779B97F4A7C15L + n).nextDouble() < probability;
        }
    }
}
