package org.zweep.runner.results;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

class JsonTest {
    record Reading(double frequencyHz, double tolerancePercent, Double uResistanceOhm, List<Double> values,
            Map<String, Double> sigma) {
    }

    @Test
    void namesAreSnakeCaseAndNumbersThatAreNotFiniteAreNull() throws Exception {
        String text = Json.text(new Reading(1000.0, Double.NaN, Double.POSITIVE_INFINITY,
                List.of(1.5, Double.NaN), Map.of("c_f", Double.NEGATIVE_INFINITY)));
        JsonNode n = Json.reader().readTree(text);
        assertEquals(List.of("frequency_hz", "tolerance_percent", "u_resistance_ohm", "values", "sigma"),
                List.copyOf(iterable(n)));
        assertEquals(1000.0, n.get("frequency_hz").asDouble());
        assertTrue(n.get("tolerance_percent").isNull());
        assertTrue(n.get("u_resistance_ohm").isNull());
        assertTrue(n.get("values").get(1).isNull());
        assertTrue(n.get("sigma").get("c_f").isNull());
        assertTrue(text.endsWith("}\n"), text);
    }

    @Test
    void readingIgnoresFieldsItDoesNotKnow() throws Exception {
        Reading r = Json.reader().forType(Reading.class).readValue(
                "{\"frequency_hz\": 50.0, \"tolerance_percent\": 5, \"added_later\": true}");
        assertEquals(50.0, r.frequencyHz());
        assertEquals(5.0, r.tolerancePercent());
    }

    private static List<String> iterable(JsonNode n) {
        List<String> out = new java.util.ArrayList<>();
        n.fieldNames().forEachRemaining(out::add);
        return out;
    }
}
