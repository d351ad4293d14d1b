package org.zweep.driver.dialect;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.URISyntaxException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.stream.Stream;

/** Test data files beside the test classes. */
final class TestResources {
    private TestResources() {
    }

    /** The files in resource folder {@code dir} (relative to this package) ending in {@code suffix}, sorted. */
    static Stream<Path> files(String dir, String suffix) {
        try {
            Path folder = Path.of(TestResources.class.getResource(dir).toURI());
            try (Stream<Path> files = Files.list(folder)) {
                return files.filter(p -> p.toString().endsWith(suffix)).sorted().toList().stream();
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        } catch (URISyntaxException e) {
            throw new IllegalStateException(e);
        }
    }
}
