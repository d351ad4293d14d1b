package org.zweep.config;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;

class SchemaTest {
    private static final Schema TIMING = Schema.of("section 'timing'", "settle", "per-point").require("identify");

    private static YamlNode yaml(String text) {
        return BoundedYaml.composeOne(text, "m.yaml", "test file").orElseThrow();
    }

    @Test
    void aMistypedKeyIsNamedAtItsLineAndColumnWithTheNearestAllowedKey() {
        ConfigException e = assertThrows(ConfigException.class, () -> yaml("identify: x\nsetle: 1\n").map(TIMING));
        assertEquals("m.yaml:2:1: unknown key 'setle' in section 'timing' (did you mean 'settle'?); expected one of: "
                + "settle, per-point, identify", e.getMessage());
    }

    @Test
    void aMissingRequiredKeyIsReportedAtTheMapping() {
        ConfigException e = assertThrows(ConfigException.class, () -> yaml("\n  settle: 1\n").map(TIMING));
        assertEquals("m.yaml:2:3: missing key 'identify' in section 'timing'", e.getMessage());
    }

    @Test
    void aRepeatedKeyIsAnError() {
        ConfigException e = assertThrows(ConfigException.class, () -> yaml("identify: a\nidentify: b\n").map(TIMING));
        assertEquals("m.yaml:2:1: duplicate key 'identify' in section 'timing'", e.getMessage());
    }

    @Test
    void nodesKnowTheirPlace() {
        YamlNode n = yaml("identify: x\nsettle:\n  - 1\n").map(TIMING).required("settle").items("a list").get(0);
        assertEquals("m.yaml:3:5", n.where());
        assertEquals(3, n.line());
        assertEquals(5, n.column());
    }

    @Test
    void brokenYamlSaysWhereAndWhat() {
        YamlSyntaxException e = assertThrows(YamlSyntaxException.class, () -> yaml("a: [1, 2\n"));
        assertEquals("m.yaml:2:1", e.where());
        assertEquals("m.yaml:2:1: YAML syntax: " + e.problem() + " (while parsing a flow sequence at line 1, column 4)",
                e.getMessage());
    }
}
