package org.zweep.runner.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code zweep compare} on two runs of the shipped capacitor sequence with different simulator
 * seeds: each check's value is the one {@code zweep analyze --json} gives for its folder, the
 * difference and relative change follow from them, and the overlaid plots are written.
 */
class CompareIT {
    @TempDir
    Path dir;

    @Test
    void twoSeedsCompareCheckByCheckAsTheirOwnAnalysesSay() throws Exception {
        Path a = dir.resolve("seed-1");
        Path b = dir.resolve("seed-2");
        assertEquals(0, StoreFolders.measure(a, 1, "SN-A", "L", null).code());
        assertEquals(0, StoreFolders.measure(b, 2, "SN-B", "L", null).code());
        Sims.Result r = Sims.zweep("compare", a.toString(), b.toString(), "--json", "--plots",
                dir.resolve("plots").toString());
        assertEquals(0, r.code(), r.err());
        ObjectMapper json = new ObjectMapper();
        JsonNode c = json.readTree(r.out());
        assertEquals("SN-A", c.at("/runs/0/label").asText());
        assertEquals("SN-B", c.at("/runs/1/label").asText());
        JsonNode analysisA = json.readTree(Sims.zweep("analyze", a.toString(), "--json").out());
        JsonNode analysisB = json.readTree(Sims.zweep("analyze", b.toString(), "--json").out());
        int checks = 0;
        for (JsonNode row : c.get("rows")) {
            if (!row.get("kind").asText().equals("check")) {
                continue;
            }
            checks++;
            String name = row.get("name").asText();
            double va = lastValue(analysisA, name);
            double vb = lastValue(analysisB, name);
            assertEquals(va, row.at("/values/0").asDouble(), 0.0, name);
            assertEquals(vb, row.at("/values/1").asDouble(), 0.0, name);
            assertEquals(vb - va, row.at("/differences/1").asDouble(), Math.abs(va) * 1e-15, name);
            assertEquals((vb - va) / Math.abs(va), row.at("/relative/1").asDouble(), 1e-12, name);
        }
        assertEquals(3, checks);
        assertNotEquals(0.0, c.at("/rows/0/differences/1").asDouble(), "different seeds measure differently");
        assertTrue(c.toString().contains("\"fit\""), "fitted elements are compared too");
        assertTrue(Files.size(dir.resolve("plots/frequency-sweep-impedance.png")) > 1000);
        assertTrue(Files.readString(dir.resolve("plots/frequency-sweep-impedance.svg")).contains("SN-B"));
        Sims.Result table = Sims.zweep("compare", a.toString(), b.toString());
        assertTrue(table.out().contains("check capacitance-1khz"), table.out());
    }

    private static double lastValue(JsonNode analysis, String check) {
        for (JsonNode c : analysis.get("checks")) {
            if (c.get("name").asText().equals(check)) {
                JsonNode v = c.get("values");
                return v.get(v.size() - 1).asDouble();
            }
        }
        throw new AssertionError("no check " + check);
    }

    @Test
    void oneRunIsNotAComparison() {
        Sims.Result r = Sims.zweep("compare", dir.toString());
        assertEquals(2, r.code());
    }
}
