package org.zweep.runner.compensation;

import com.fasterxml.jackson.annotation.JsonProperty;
import com.fasterxml.jackson.core.JsonProcessingException;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import org.zweep.driver.InvalidInputException;
import org.zweep.driver.meter.CorrectionStandard;
import org.zweep.runner.results.Csv;
import org.zweep.runner.results.Json;

/**
 * Host-side compensation data: each standard's reading at each frequency, with the time and the
 * settings it was measured at. Stored as {@code NAME.csv} (cells as {@link Csv} writes them) (columns {@code standard,
 * frequency_hz, r_ohm, x_ohm, time, status}; {@code status} is {@code ok}, or {@code over_range}
 * for an OPEN the meter read as overload or beyond its range, with empty R and X) with a sidecar
 * {@code NAME.json} describing the settings. Files without the {@code status} column (written
 * before it existed) are read as all {@code ok}.
 *
 * @param info when, on which meter and how the standards were measured
 * @param entries the readings, grouped by standard, ascending in frequency within a standard
 */
public record CompensationData(Info info, List<Entry> entries) {
    /** The CSV header. */
    public static final String HEADER = "standard,frequency_hz,r_ohm,x_ohm,time,status";
    /** The header of files written before the status column. */
    static final String HEADER_WITHOUT_STATUS = "standard,frequency_hz,r_ohm,x_ohm,time";
    /** The status of an OPEN reading beyond the meter's range. */
    public static final String OVER_RANGE = "over_range";
    /** The sidecar's format tag. */
    public static final String FORMAT = "zweep-compensation/1";

    public CompensationData {
        entries = List.copyOf(entries);
    }

    /**
     * What the data was measured with.
     *
     * @param format {@link #FORMAT}
     * @param time when the measurement of the standards finished (ISO-8601)
     * @param meter the meter's identity
     * @param terminals the terminal configuration, {@code TWO_TERMINAL} or {@code FOUR_TERMINAL} (the file's
     *     {@code connection})
     * @param standards the standards measured, in order
     * @param loadROhm the load standard's known resistance ({@code null} without LOAD)
     * @param loadXOhm the load standard's known reactance ({@code null} without LOAD)
     * @param driveMode {@code V} or {@code A} (the file's {@code drive})
     * @param level the drive level in V rms or A rms
     * @param averaging the averaging count
     * @param integrationS the integration time in seconds
     */
    public record Info(String format, String time, String meter,
            @JsonProperty("connection") String terminals, List<String> standards,
            Double loadROhm, Double loadXOhm, @JsonProperty("drive") String driveMode, double level, int averaging, double integrationS) {
    }

    /**
     * One standard's reading at one frequency.
     *
     * @param overRange whether the meter read it as overload or beyond its range (only ever an
     *     OPEN: its admittance lies below what the meter can see, taken as 0); R and X are NaN then
     */
    public record Entry(CorrectionStandard standard, double frequencyHz, double rOhm, double xOhm, Instant time,
            boolean overRange) {
        /** A reading the meter gave. */
        public Entry(CorrectionStandard standard, double frequencyHz, double rOhm, double xOhm, Instant time) {
            this(standard, frequencyHz, rOhm, xOhm, time, false);
        }

        /** An OPEN the meter read as overload or beyond its range at {@code frequencyHz}. */
        public static Entry openOverRange(double frequencyHz, Instant time) {
            return new Entry(CorrectionStandard.OPEN, frequencyHz, Double.NaN, Double.NaN, time, true);
        }
    }

    /** The frequencies at which the OPEN was beyond the meter's range, ascending. */
    public List<Double> openOverRangeHz() {
        return of(CorrectionStandard.OPEN).stream().filter(Entry::overRange).map(Entry::frequencyHz).toList();
    }

    /** When the data was measured. */
    public Instant time() {
        return Instant.parse(info.time());
    }

    /** The entries of {@code standard}, ascending in frequency. */
    public List<Entry> of(CorrectionStandard standard) {
        return entries.stream().filter(e -> e.standard() == standard)
                .sorted(java.util.Comparator.comparingDouble(Entry::frequencyHz)).toList();
    }

    /**
     * Writes {@code csv} and its sidecar (same name, {@code .json}), each to a temporary file first
     * and then moved into place, the sidecar first: a failure part-way (a full disk) leaves either
     * both files whole or no {@code csv} (so a resumed run measures the standards again), never a
     * half-written one.
     */
    public void write(Path csv) {
        StringBuilder b = new StringBuilder(HEADER).append('\n');
        for (Entry e : entries) {
            Csv.append(b, List.of(e.standard().name(), Csv.number(e.frequencyHz()),
                    e.overRange() ? "" : Csv.number(e.rOhm()), e.overRange() ? "" : Csv.number(e.xOhm()),
                    e.time().toString(), e.overRange() ? OVER_RANGE : "ok")).append('\n');
        }
        try {
            Files.createDirectories(csv.toAbsolutePath().getParent());
        } catch (IOException e) {
            throw new UncheckedIOException("cannot create " + csv.toAbsolutePath().getParent() + ": " + e.getMessage(), e);
        }
        String json;
        try {
            json = Json.writer().writeValueAsString(info) + "\n";
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("cannot write compensation settings: " + e.getMessage(), e);
        }
        writeWhole(sidecar(csv), json);
        writeWhole(csv, b.toString());
    }

    private static void writeWhole(Path file, String text) {
        Path tmp = file.resolveSibling(file.getFileName() + ".tmp");
        try {
            try (java.nio.channels.FileChannel ch = java.nio.channels.FileChannel.open(tmp,
                    java.nio.file.StandardOpenOption.CREATE, java.nio.file.StandardOpenOption.WRITE,
                    java.nio.file.StandardOpenOption.TRUNCATE_EXISTING)) {
                java.nio.ByteBuffer buf = java.nio.ByteBuffer.wrap(text.getBytes(StandardCharsets.UTF_8));
                while (buf.hasRemaining()) {
                    ch.write(buf);
                }
                ch.force(true);
            }
            Files.move(tmp, file, java.nio.file.StandardCopyOption.REPLACE_EXISTING,
                    java.nio.file.StandardCopyOption.ATOMIC_MOVE);
        } catch (IOException e) {
            try {
                Files.deleteIfExists(tmp);
            } catch (IOException ignored) {
                // the failure below is what matters
            }
            throw new UncheckedIOException("cannot write " + file + ": " + e.getMessage(), e);
        }
    }

    /**
     * Reads data written by {@link #write}.
     *
     * @throws InvalidInputException naming the file and line of what is malformed
     */
    public static CompensationData read(Path csv) {
        Info info;
        try {
            info = Json.reader().forType(Info.class).readValue(sidecar(csv).toFile());
        } catch (JsonProcessingException e) {
            throw new InvalidInputException(sidecar(csv) + ": not valid compensation settings: "
                    + e.getOriginalMessage());
        } catch (IOException e) {
            throw new InvalidInputException(csv + ": cannot read compensation data: " + e.getMessage());
        }
        if (!FORMAT.equals(info.format())) {
            throw new InvalidInputException(sidecar(csv) + ": format is " + info.format() + ", expected " + FORMAT);
        }
        List<Entry> entries = new ArrayList<>();
        try (CSVParser parser = CSVParser.parse(csv, StandardCharsets.UTF_8, Csv.FORMAT)) {
            int cells = 0;
            for (CSVRecord r : parser) {
                List<String> c = r.toList();
                long line = r.getRecordNumber(); // one record per line here: no cell holds a line break
                if (cells == 0) {
                    String header = String.join(",", c);
                    if (!header.equals(HEADER) && !header.equals(HEADER_WITHOUT_STATUS)) {
                        throw new InvalidInputException(csv + ":1: expected the header " + HEADER);
                    }
                    cells = c.size();
                    continue;
                }
                entries.add(entry(csv, line, c, cells));
            }
            if (cells == 0) {
                throw new InvalidInputException(csv + ":1: expected the header " + HEADER);
            }
        } catch (IOException | java.io.UncheckedIOException e) {
            throw new InvalidInputException(csv + ": cannot read compensation data: " + e.getMessage());
        }
        return new CompensationData(info, entries);
    }

    private static Entry entry(Path csv, long line, List<String> c, int cells) {
        try {
            if (c.size() != cells) {
                throw new IllegalArgumentException("expected " + cells + " cells, found " + c.size());
            }
            CorrectionStandard standard = CorrectionStandard.valueOf(c.get(0));
            boolean over = cells == 6 && c.get(5).equals(OVER_RANGE);
            if (cells == 6 && !over && !c.get(5).equals("ok")) {
                throw new IllegalArgumentException("status '" + c.get(5) + "' is neither ok nor " + OVER_RANGE);
            }
            if (over && standard != CorrectionStandard.OPEN) {
                throw new IllegalArgumentException("only an OPEN may be " + OVER_RANGE);
            }
            return over ? Entry.openOverRange(Double.parseDouble(c.get(1)), Instant.parse(c.get(4)))
                    : new Entry(standard, Double.parseDouble(c.get(1)), Double.parseDouble(c.get(2)),
                            Double.parseDouble(c.get(3)), Instant.parse(c.get(4)));
        } catch (RuntimeException e) {
            throw new InvalidInputException(csv + ":" + line + ": malformed row: " + e.getMessage());
        }
    }

    static Path sidecar(Path csv) {
        String name = csv.getFileName().toString();
        String base = name.endsWith(".csv") ? name.substring(0, name.length() - 4) : name;
        return csv.resolveSibling(base + ".json");
    }
}
