package org.zweep.runner.results;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.zweep.driver.InvalidInputException;

class RunManifestTest {
    @TempDir
    Path dir;

    static RunManifest sample() {
        return RunManifest.builder()
                .sequence(new RunManifest.SequenceInfo("incoming", "/x/incoming.yaml", "ab12", "sequence.yaml"))
                .part(new RunManifest.PartInfo("capacitor", "KP-C0805-104", 1.0e-7, "F", 10.0, null))
                .steps(List.of(new RunManifest.StepInfo(0, "sweep", 31)))
                .checks(List.of(new RunManifest.CheckInfo("cs", "cs_f", "sweep", 1000.0, 9.0e-8, 1.1e-7),
                        new RunManifest.CheckInfo("srf", "srf_hz", "sweep", null, 1.0e7, null)))
                .meter(new RunManifest.MeterInfo("sim:bench.yaml", "standard", "Zweep,SIM,0,1"))
                .compensation(new RunManifest.CompensationInfo("host", List.of("OPEN", "SHORT"), "compensation/host.csv"))
                .software(new RunManifest.SoftwareInfo("zweep", "0.1.0")).host("bench-pc").seed(1234L)
                .started("2024-05-01T10:00:00Z").counts(new RunManifest.Counts(31, 0)).outcome("running")
                .verdict("none").build();
    }

    @Test
    void jsonHasTheContractFieldNames() throws Exception {
        JsonNode n = new ObjectMapper().readTree(sample().toJson());
        // RUNFOLDER.md run.json example
        assertEquals("zweep-run/1", n.get("format").asText());
        assertEquals("sequence.yaml", n.at("/sequence/copy").asText());
        assertEquals(10.0, n.at("/part/tolerance_percent").asDouble());
        assertTrue(n.at("/part/turns_ratio").isNull());
        assertEquals(1000.0, n.at("/checks/0/frequency_hz").asDouble());
        assertTrue(n.at("/checks/1/frequency_hz").isNull());
        assertTrue(n.at("/checks/1/max").isNull());
        assertEquals(31, n.at("/counts/planned").asInt());
        assertTrue(n.get("ended").isNull());
        assertEquals(1234, n.get("seed").asLong());
        assertEquals(List.of("format", "id", "sequence", "part", "identity", "steps", "checks", "meter", "compensation",
                "software", "host", "seed", "started", "ended", "counts", "outcome", "verdict", "index"), iterable(n));
    }

    private static List<String> iterable(JsonNode n) {
        List<String> names = new java.util.ArrayList<>();
        n.fieldNames().forEachRemaining(names::add);
        return names;
    }

    @Test
    void writeThenReadGivesTheSameManifest() {
        Path f = dir.resolve("run.json");
        sample().write(f);
        assertEquals(sample(), RunManifest.read(f));
        RunManifest done = sample().finished("completed", "2024-05-01T10:01:00Z", new RunManifest.Counts(31, 31), "pass");
        done.write(f);
        assertEquals(done, RunManifest.read(f));
        assertTrue(Files.notExists(dir.resolve("run.json.tmp")));
    }

    @Test
    void otherFormatIsRejected() throws Exception {
        Path f = dir.resolve("run.json");
        Files.writeString(f, "{\"format\":\"other/2\"}");
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> RunManifest.read(f));
        assertTrue(e.getMessage().contains("expected zweep-run/1"), e.getMessage());
    }

    @Test
    void notJsonIsRejectedWithoutAStackTraceMessage() throws Exception {
        Path f = dir.resolve("run.json");
        Files.writeString(f, "{not json");
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> RunManifest.read(f));
        // RFC 8259 §4: member names are strings; the offending n is at line 1, column 2
        assertEquals(f + ":1:2: not a valid run manifest: Unexpected character ('n' (code 110)): was expecting"
                + " double-quote to start field name", e.getMessage());
    }

    @Test
    void aValueOfTheWrongTypeIsNamedWithItsPathLineAndColumn() throws Exception {
        Path f = dir.resolve("run.json");
        Files.writeString(f, "{\n  \"format\": \"zweep-run/1\",\n  \"counts\": {\"planned\": \"many\"}\n}\n");
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> RunManifest.read(f));
        // the value "many" starts at line 3, column 25 (counted by hand)
        assertEquals(f + ":3:25: not a valid run manifest: counts.planned: Cannot deserialize value of type `int`"
                + " from String \"many\": not a valid `int` value", e.getMessage());
        assertFalse(e.getMessage().contains("Source"), e.getMessage());
    }
}
