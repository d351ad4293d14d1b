package org.zweep.runner.live;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.BufferedReader;
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.UUID;
import java.util.concurrent.BlockingQueue;
import java.util.concurrent.LinkedBlockingQueue;
import java.util.concurrent.TimeUnit;
import org.zweep.runner.safety.Interruption;
import org.zweep.runner.engine.Prompter;
import org.zweep.runner.engine.RunInterruptedException;

/**
 * Prompts through the live view: writes a {@code prompt} event and waits until an {@code answer}
 * event with the prompt's id appears in the events file (posted from any page viewing the run) or,
 * when the run has a terminal, until Enter is pressed there. Then writes {@code prompt_answered}.
 * Asked after the meter's own fixture switched too, so that a live run can be followed and answered
 * from the page.
 */
public final class LivePrompter implements Prompter {
    private static final long POLL_MS = 25;
    private final EventLog log;
    private final PrintWriter out;
    private final BlockingQueue<String> terminalLines;
    private final Interruption interruption;
    private EventTail since;

    /**
     * @param log the run's events
     * @param out where the prompt is shown as well
     * @param terminal the terminal's input, or null when there is none
     * @param interruption the run's Ctrl-C state (a stop request ends the wait)
     */
    public LivePrompter(EventLog log, PrintWriter out, BufferedReader terminal, Interruption interruption) {
        this.log = log;
        this.out = out;
        this.interruption = interruption;
        if (terminal != null) {
            terminalLines = new LinkedBlockingQueue<>();
            Thread pump = new Thread(() -> {
                try {
                    String line;
                    while ((line = terminal.readLine()) != null) {
                        terminalLines.add(line);
                    }
                } catch (IOException e) {
                    // the terminal went away: answers come from the page only
                }
            }, "zweep-terminal-answers");
            pump.setDaemon(true);
            pump.start();
        } else {
            terminalLines = null;
        }
    }

    @Override
    public void prompt(String instruction) {
        String id = UUID.randomUUID().toString();
        since = EventTail.fromEnd(log.file());
        log.write("prompt", n -> {
            n.put("id", id);
            n.put("text", instruction);
        });
        out.println(">> " + instruction + " - answer on the live page" + (terminalLines != null ? " or press Enter" : ""));
        out.flush();
        String by = null;
        try {
            while (by == null) {
                if (interruption != null && interruption.requested()) {
                    throw new RunInterruptedException("stopped at an operator prompt");
                }
                if (terminalLines != null && terminalLines.poll(POLL_MS, TimeUnit.MILLISECONDS) != null) {
                    by = "terminal";
                } else if (terminalLines == null) {
                    Thread.sleep(POLL_MS);
                }
                if (by == null && answered(id)) {
                    by = "page";
                }
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new RunInterruptedException("interrupted at an operator prompt");
        }
        String how = by;
        log.write("prompt_answered", n -> {
            n.put("id", id);
            n.put("by", how);
        });
    }

    /** Whether an answer event for {@code id} was appended since the prompt was written. */
    private boolean answered(String id) {
        try {
            for (EventTail.Line line : since.read()) {
                JsonNode n = org.zweep.runner.results.Json.readTree(line.text());
                if ("answer".equals(n.path("type").asText()) && id.equals(n.path("id").asText())) {
                    return true;
                }
            }
            return false;
        } catch (IOException e) {
            return false;
        }
    }

    /** Appends an answer to prompt {@code id} of the run in {@code dir} (what the page's button does). */
    public static void answer(Path dir, String id) {
        EventLog.append(dir, "answer", n -> n.put("id", id));
    }
}
