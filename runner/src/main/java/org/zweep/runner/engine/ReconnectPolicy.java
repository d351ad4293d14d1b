package org.zweep.runner.engine;

/**
 * How the engine reconnects after a lost link or a timeout: waits growing from
 * {@code firstDelayS} by {@code factor} up to {@code maxDelayS}, until {@code budgetS} seconds of
 * waiting or {@code maxAttempts} attempts are spent since the last operation that succeeded (so
 * a link that keeps breaking before a point can be finished also ends the run).
 *
 * @param firstDelayS the wait before the first attempt, in seconds
 * @param maxDelayS the longest wait between attempts, in seconds
 * @param factor how much each wait grows (at least 1)
 * @param budgetS the most seconds of waiting for one failure before giving up
 * @param maxAttempts the most reconnect attempts for one failure
 */
public record ReconnectPolicy(double firstDelayS, double maxDelayS, double factor, double budgetS, int maxAttempts) {
    /** 0.2 s doubling to 5 s, giving up after 60 s or 20 attempts. */
    public static final ReconnectPolicy DEFAULT = new ReconnectPolicy(0.2, 5.0, 2.0, 60.0, 20);

    /** This policy with another waiting budget in seconds. */
    public ReconnectPolicy withBudgetS(double s) {
        return new ReconnectPolicy(firstDelayS, maxDelayS, factor, s, maxAttempts);
    }
}
