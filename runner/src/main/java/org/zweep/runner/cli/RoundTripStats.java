package org.zweep.runner.cli;

import java.util.Arrays;

/**
 * Summary of measured round trips, in microseconds.
 *
 * @param count number of round trips
 * @param minUs fastest
 * @param medianUs median (the mean of the two middle values for an even count)
 * @param p99Us 99th percentile by the nearest-rank definition (the value at rank ceil(0.99 n))
 * @param maxUs slowest
 * @param perS round trips per second: count divided by the sum of all round-trip times
 */
record RoundTripStats(int count, double minUs, double medianUs, double p99Us, double maxUs, double perS) {

    /** Summarises round-trip times in nanoseconds (at least one). */
    static RoundTripStats ofNanos(long[] nanos) {
        if (nanos.length == 0) {
            throw new IllegalArgumentException("no round trips");
        }
        long[] s = nanos.clone();
        Arrays.sort(s);
        int n = s.length;
        double median = n % 2 == 1 ? s[n / 2] : (s[n / 2 - 1] + s[n / 2]) / 2.0;
        long p99 = s[(int) Math.ceil(0.99 * n) - 1];
        double total = 0;
        for (long v : s) {
            total += v;
        }
        return new RoundTripStats(n, s[0] / 1e3, median / 1e3, p99 / 1e3, s[n - 1] / 1e3, n / (total / 1e9));
    }
}
