package org.zweep.driver.dialect;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;

/** The worked example in README must be the dialect zweep ships, so the documentation cannot rot. */
class ReadmeDialectExampleTest {

    @Test
    void readmeWorkedExampleIsTheShippedMz300Dialect() throws IOException {
        // surefire runs in the module directory; README.md is at the repository root
        String readme = Files.readString(Path.of("..", "README.md"), StandardCharsets.UTF_8);
        int docs = readme.indexOf("### Dialect files");
        assertTrue(docs >= 0, "README has no dialect files section");
        int start = readme.indexOf("```yaml\n# Worked example", docs);
        assertTrue(start >= 0, "README has no worked-example block");
        start += "```yaml\n".length();
        String block = readme.substring(start, readme.indexOf("```", start));

        String shipped;
        try (InputStream in = Dialect.class.getResourceAsStream("mz300.yaml")) {
            shipped = new String(in.readAllBytes(), StandardCharsets.UTF_8);
        }
        assertEquals(shipped, block);
    }
}
