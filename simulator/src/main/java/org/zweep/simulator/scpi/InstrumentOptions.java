package org.zweep.simulator.scpi;

/**
 * How the simulated meter behaves apart from its bench.
 *
 * @param timing how long points take ({@link TimingModel#REAL} by default)
 * @param errorQueueDepth error queue entries before {@code -350} overflow (at least 2; 16 by default)
 * @param strict the IEEE 488.2 §6.3.2 query rules that each new connection starts with: report
 *     {@code -410} when a new message arrives before the previous reply was sent, and {@code
 *     -420} on an in-memory read with no query pending (off by default: replies are queued)
 * @param benchLoader what {@code SIMulate:BENCh} and {@code SIMulate:DEVice} use, or {@code null}
 *     when loading is not available ({@code -200})
 */
public record InstrumentOptions(TimingModel timing, int errorQueueDepth, boolean strict, BenchLoader benchLoader) {

    public InstrumentOptions {
        if (timing == null) {
            throw new IllegalArgumentException("timing is required");
        }
        if (errorQueueDepth < 2) {
            throw new IllegalArgumentException("error queue depth must be at least 2, got " + errorQueueDepth);
        }
    }

    /** Real timing, a 16-entry error queue, queued replies, no bench loader. */
    public static InstrumentOptions defaults() {
        return new InstrumentOptions(TimingModel.REAL, 16, false, null);
    }

    /** A copy with {@code timing}. */
    public InstrumentOptions withTiming(TimingModel t) {
        return new InstrumentOptions(t, errorQueueDepth, strict, benchLoader);
    }

    /** A copy with an error queue of {@code depth} entries. */
    public InstrumentOptions withErrorQueueDepth(int depth) {
        return new InstrumentOptions(timing, depth, strict, benchLoader);
    }

    /** A copy with strict IEEE 488.2 query rules on or off. */
    public InstrumentOptions withStrict(boolean s) {
        return new InstrumentOptions(timing, errorQueueDepth, s, benchLoader);
    }

    /** A copy with {@code loader}. */
    public InstrumentOptions withBenchLoader(BenchLoader loader) {
        return new InstrumentOptions(timing, errorQueueDepth, strict, loader);
    }
}
