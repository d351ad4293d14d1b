package org.zweep.simulator;

import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.AccessDeniedException;
import java.nio.file.Files;
import java.nio.file.InvalidPathException;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.List;

/** Reading description files nobody vouches for, in bounded memory. */
public final class InputFiles {
    /** The largest netlist file read, in bytes. */
    public static final int MAX_NETLIST_BYTES = 1 << 20;
    /**
     * The largest bench file (YAML) read, in bytes: small enough that the two passes over it
     * (limits, then nodes) stay well under a second on a cold JVM.
     */
    public static final int MAX_BENCH_BYTES = org.zweep.config.BoundedYaml.MAX_FILE_BYTES;

    private InputFiles() {
    }

    /**
     * Reads at most {@code maxBytes} bytes of UTF-8 text; a device such as {@code /dev/zero} or a
     * pipe is refused once the limit is passed, without reading further.
     *
     * @param what what the file is, for the message ("bench file")
     * @param maxBytes the limit ({@link #MAX_BENCH_BYTES}, {@link #MAX_NETLIST_BYTES})
     * @throws SimulatorInputException naming the file and the limit, or why it cannot be read
     */
    public static String read(Path file, String what, int maxBytes) {
        byte[] bytes;
        try (InputStream in = Files.newInputStream(file)) {
            bytes = in.readNBytes(maxBytes + 1);
        } catch (NoSuchFileException e) {
            throw new SimulatorInputException(file + ": cannot read the " + what + ": no such file");
        } catch (AccessDeniedException e) {
            throw new SimulatorInputException(file + ": cannot read the " + what + ": permission denied");
        } catch (IOException e) {
            throw new SimulatorInputException(file + ": cannot read the " + what + ": "
                    + (e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage()));
        }
        if (bytes.length > maxBytes) {
            throw new SimulatorInputException(file + ": larger than " + maxBytes + " bytes, the limit for a " + what);
        }
        try {
            return StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPORT)
                    .onUnmappableCharacter(CodingErrorAction.REPORT).decode(ByteBuffer.wrap(bytes)).toString();
        } catch (CharacterCodingException e) {
            throw new SimulatorInputException(file + ": the " + what + " is not UTF-8 text");
        }
    }

    /**
     * The file {@code name} names inside one of {@code folders}: a relative name is looked up in
     * each folder in turn, an absolute one must lie in one of them; symbolic links are followed
     * before the check, so a link cannot lead out.
     *
     * @return the file's real path, or {@code null} when it is not an existing regular file inside
     *     a folder (the caller cannot tell a missing file from one outside, and neither can a client)
     */
    public static Path inside(String name, List<Path> folders) {
        Path asked;
        try {
            asked = Path.of(name);
        } catch (InvalidPathException e) {
            return null;
        }
        for (Path folder : folders) {
            try {
                Path root = folder.toRealPath();
                Path real = root.resolve(asked).toRealPath();
                if (real.startsWith(root) && Files.isRegularFile(real)) {
                    return real;
                }
            } catch (IOException | SecurityException e) {
                // not there: try the next folder
            }
        }
        return null;
    }
}
