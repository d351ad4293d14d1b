package org.zweep.driver.scpi;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.StringWriter;
import java.time.Clock;
import java.time.Instant;
import java.time.ZoneOffset;
import org.junit.jupiter.api.Test;

class TrafficTraceTest {

    @Test
    void everyChunkIsOneTimestampedEscapedLine() {
        StringWriter w = new StringWriter();
        TrafficTrace trace = new TrafficTrace(w, Clock.fixed(Instant.parse("2024-05-06T07:08:09.123Z"), ZoneOffset.UTC));
        ScriptedTransport meter = new ScriptedTransport().send("1.0\r\n");
        ScpiClient client = ScpiClient.connect(new TracingTransport(meter, trace),
                ScpiSettings.builder().clearOnConnect(false).build());
        client.query("FREQ?");
        trace.event("note");
        assertEquals("2024-05-06T07:08:09.123Z > FREQ?\\n\n"
                + "2024-05-06T07:08:09.123Z < 1.0\\r\\n\n"
                + "2024-05-06T07:08:09.123Z ! note\n", w.toString());
    }

    @Test
    void binaryChunksAreShownAsHexAndCut() {
        StringWriter w = new StringWriter();
        TrafficTrace trace = new TrafficTrace(w, Clock.fixed(Instant.EPOCH, ZoneOffset.UTC));
        byte[] big = new byte[TrafficTrace.SHOWN_BYTES + 5];
        trace.received(big, 0, big.length);
        String line = w.toString();
        assertEquals(true, line.startsWith("1970-01-01T00:00:00Z < \\x00\\x00"));
        assertEquals(true, line.endsWith("... (5 more bytes)\n"));
        assertEquals(1, line.chars().filter(c -> c == '\n').count());
    }
}
