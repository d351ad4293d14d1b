package org.zweep.driver.testpeer;

import java.nio.charset.StandardCharsets;
import java.time.Duration;

/** One step of a scripted reply: faults are values like any other step. */
public sealed interface Action {

    /** Send these bytes now (one write, so usually one packet). */
    record Send(byte[] bytes) implements Action {
    }

    /** Wait before the next step. */
    record Pause(Duration duration) implements Action {
    }

    /** Never answer: wait until the peer is closed. */
    record Stall() implements Action {
    }

    /** Close the connection now. */
    record Close() implements Action {
    }

    static Action send(String text) {
        return new Send(text.getBytes(StandardCharsets.ISO_8859_1));
    }

    static Action send(byte[] bytes) {
        return new Send(bytes.clone());
    }

    static Action pause(long millis) {
        return new Pause(Duration.ofMillis(millis));
    }

    static Action stall() {
        return new Stall();
    }

    static Action close() {
        return new Close();
    }
}
