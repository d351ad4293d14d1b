package org.zweep.runner.safety;

import java.io.PrintWriter;
import java.lang.reflect.InvocationHandler;
import java.lang.reflect.Method;
import java.lang.reflect.Proxy;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.BooleanSupplier;

/**
 * Keeps DC bias off when a run is stopped from outside. While installed:
 * <ul>
 *   <li>the first Ctrl-C (SIGINT) asks the run to stop after the point in progress; the run then
 *       brings bias down at the step's ramp rate, writes everything and leaves a resumable folder;</li>
 *   <li>a second Ctrl-C cuts bias at once (no ramp), says so and exits with code 130 within
 *       {@link #SECOND_STOP_MILLIS} ms, whatever the link does: when the meter has not confirmed
 *       bias off by then (a stalled link), it says that it could not confirm and exits anyway;</li>
 *   <li>JVM shutdown (SIGTERM, {@code System.exit}) asks the run to stop the same way, waits up to
 *       {@code graceMillis} for it (the ramp down included), and cuts bias itself, saying so, if
 *       the run did not stop in time.</li>
 * </ul>
 * Signal handling uses the JDK's {@code sun.misc.Signal} when present (looked up reflectively);
 * without it, Ctrl-C is handled as JVM shutdown. {@link #close()} restores the previous handlers.
 */
public final class BiasOffHook implements AutoCloseable {
    /** Exit code after a second Ctrl-C (128 + SIGINT). */
    public static final int EXIT_INTERRUPTED = 130;
    /** How long a second Ctrl-C waits for the meter to confirm bias off before the process ends. */
    static final long SECOND_STOP_MILLIS = 350;

    private final Interruption interruption;
    private final BooleanSupplier biasOff;
    private final PrintWriter err;
    private final long graceMillis;
    private final Thread hook;
    private final AtomicInteger signals = new AtomicInteger();
    private Object previousInt;

    private BiasOffHook(Interruption interruption, BooleanSupplier biasOff, PrintWriter err, long graceMillis) {
        this.interruption = interruption;
        this.biasOff = biasOff;
        this.err = err;
        this.graceMillis = graceMillis;
        this.hook = new Thread(this::onShutdown, "zweep-bias-off");
    }

    /**
     * Installs the hook and the Ctrl-C handler.
     *
     * @param interruption the run's stop request, marked stopped by the run when done
     * @param biasOff turns bias off now and tells whether the meter confirmed; must not throw
     * @param err where to tell the operator what is happening
     * @param graceMillis how long JVM shutdown waits for the run to stop by itself
     */
    public static BiasOffHook install(Interruption interruption, BooleanSupplier biasOff, PrintWriter err,
            long graceMillis) {
        BiasOffHook h = new BiasOffHook(interruption, biasOff, err, graceMillis);
        Runtime.getRuntime().addShutdownHook(h.hook);
        h.previousInt = h.trap("INT");
        return h;
    }

    /** Handles one Ctrl-C as the signal handler does (exposed for tests of the sequence of events). */
    void onInterrupt() {
        if (signals.incrementAndGet() == 1) {
            err.println();
            err.println("zweep: stopping after the point in progress; DC bias comes down at the step's ramp rate"
                    + " (Ctrl-C again to cut it at once)");
            err.flush();
            interruption.request("Ctrl-C");
        } else {
            boolean off = biasOffWithin(SECOND_STOP_MILLIS);
            err.println(off ? "zweep: stopped at once; DC bias was cut without a ramp" : "zweep: stopped at once;"
                    + " could NOT confirm that DC bias is off - check the meter before touching the part");
            err.flush();
            Runtime.getRuntime().halt(EXIT_INTERRUPTED);
        }
    }

    /**
     * Asks for bias off on a thread of its own and waits at most {@code millis} for the answer: a
     * stalled link must not hold the second Ctrl-C (the guard process is still there for bias).
     */
    private boolean biasOffWithin(long millis) {
        java.util.concurrent.CompletableFuture<Boolean> f = new java.util.concurrent.CompletableFuture<>();
        Thread t = new Thread(() -> f.complete(biasOff.getAsBoolean()), "zweep-bias-cut");
        t.setDaemon(true);
        t.start();
        try {
            return f.get(millis, java.util.concurrent.TimeUnit.MILLISECONDS);
        } catch (java.util.concurrent.TimeoutException | java.util.concurrent.ExecutionException e) {
            return false;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return false;
        }
    }

    private void onShutdown() {
        if (interruption.isStopped()) {
            return;
        }
        interruption.request("shutting down");
        if (!interruption.awaitStopped(graceMillis)) {
            boolean off = biasOff.getAsBoolean();
            err.println(String.format(java.util.Locale.ROOT, "zweep: the run did not stop within %.0f s of the"
                    + " shutdown request; %s", graceMillis / 1000.0, off ? "DC bias was cut without a ramp"
                    : "could NOT confirm that DC bias is off - check the meter before touching the part"));
            err.flush();
        }
    }

    private Object trap(String name) {
        try {
            Class<?> signal = Class.forName("sun.misc.Signal");
            Class<?> handler = Class.forName("sun.misc.SignalHandler");
            Object sig = signal.getConstructor(String.class).newInstance(name);
            InvocationHandler ih = (Object proxy, Method m, Object[] args) -> {
                if (m.getName().equals("handle")) {
                    onInterrupt();
                    return null;
                }
                return switch (m.getName()) {
                    case "hashCode" -> System.identityHashCode(proxy);
                    case "equals" -> proxy == args[0];
                    case "toString" -> "zweep Ctrl-C handler";
                    default -> null;
                };
            };
            Object h = Proxy.newProxyInstance(handler.getClassLoader(), new Class<?>[] {handler}, ih);
            return signal.getMethod("handle", signal, handler).invoke(null, sig, h);
        } catch (ReflectiveOperationException | RuntimeException | LinkageError e) {
            return null;
        }
    }

    private void restore(String name, Object previous) {
        if (previous == null) {
            return;
        }
        try {
            Class<?> signal = Class.forName("sun.misc.Signal");
            Class<?> handler = Class.forName("sun.misc.SignalHandler");
            Object sig = signal.getConstructor(String.class).newInstance(name);
            signal.getMethod("handle", signal, handler).invoke(null, sig, previous);
        } catch (ReflectiveOperationException | RuntimeException | LinkageError e) {
            // the previous handler stays replaced; the process is ending its run anyway
        }
    }

    /** Removes the shutdown hook and restores the previous Ctrl-C handler. */
    @Override
    public void close() {
        try {
            Runtime.getRuntime().removeShutdownHook(hook);
        } catch (IllegalStateException e) {
            // the JVM is already shutting down: the hook is running or has run
        }
        restore("INT", previousInt);
    }
}
