package org.zweep.runner.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

class PingCommandIT extends TinyMeterCliBase {

    @Test
    void jsonHasTheDocumentedFieldsInOrderAndConsistentValues() throws Exception {
        assertEquals(0, zweep("ping", meter.address(), "--count", "50", "--json"), err.toString());
        JsonNode j = new ObjectMapper().readTree(out.toString());
        List<String> names = new ArrayList<>();
        j.fieldNames().forEachRemaining(names::add);
        assertEquals(List.of("count", "min_us", "median_us", "p99_us", "max_us", "per_s"), names);
        assertEquals(50, j.get("count").asInt());
        double min = j.get("min_us").asDouble();
        double med = j.get("median_us").asDouble();
        double p99 = j.get("p99_us").asDouble();
        double max = j.get("max_us").asDouble();
        assertTrue(0 < min && min <= med && med <= p99 && p99 <= max, j.toString());
        assertTrue(j.get("per_s").asDouble() > 0);
        // one warm-up query plus 50 measured ones, after *CLS
        assertEquals(52, meter.received.size());
        assertTrue(meter.received.subList(1, 52).stream().allMatch("*IDN?"::equals));
    }

    @Test
    void textOutputAndAnotherQuery() {
        assertEquals(0, zweep("ping", meter.address(), "--count", "5", "--query", "FREQ?"), err.toString());
        String text = out.toString();
        assertTrue(text.contains("FREQ?  5 queries"), text);
        assertTrue(text.matches("(?s).*min [0-9.]+ µs  median [0-9.]+ µs  p99 [0-9.]+ µs  max [0-9.]+ µs  \\d+ queries/s.*"),
                text);
    }

    @Test
    void aQueryWithoutQuestionMarkIsUsageError() {
        assertEquals(2, zweep("ping", meter.address(), "--query", "*RST"));
    }

    @Test
    void timeoutIsExitThree() {
        assertEquals(3, zweep("ping", meter.address(), "--query", "HANG?", "--timeout", "100ms"));
    }
}
