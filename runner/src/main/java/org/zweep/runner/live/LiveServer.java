package org.zweep.runner.live;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.net.InetSocketAddress;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.nio.file.StandardWatchEventKinds;
import java.nio.file.WatchKey;
import java.nio.file.WatchService;
import java.util.Properties;
import java.util.concurrent.TimeUnit;
import org.eclipse.jetty.http.HttpHeader;
import org.eclipse.jetty.io.Content;
import org.eclipse.jetty.server.Handler;
import org.eclipse.jetty.server.Request;
import org.eclipse.jetty.server.Response;
import org.eclipse.jetty.server.Server;
import org.eclipse.jetty.server.ServerConnector;
import org.eclipse.jetty.util.Callback;
import org.eclipse.jetty.util.FutureCallback;
import org.eclipse.jetty.util.thread.QueuedThreadPool;

/**
 * The live view of one run folder over HTTP (embedded Jetty): {@code /} the page, {@code /uplot.js}
 * and {@code /uplot.css} the charting library from the jar, {@code /events} the folder's
 * {@code events.jsonl} as server-sent events (every viewer gets the whole run, then each new line
 * as it is appended; a reconnecting browser resumes from its {@code Last-Event-ID}), and
 * {@code POST /answer} ({@code id=...}) appends the answer to a prompt. Nothing is fetched from
 * elsewhere. Each viewer is served by its own pool thread; {@link #close()} ends them. A new line
 * reaches the viewers as soon as it is written: the folder is watched (inotify on Linux, through
 * {@link WatchService}), and the file is read again at least every {@link #POLL_MS} in case a
 * change was not reported (a file system without notifications).
 */
public final class LiveServer implements AutoCloseable {
    /** How often a viewer's stream looks for new lines when no change is reported. */
    static final long POLL_MS = 250;
    private static final long HEARTBEAT_MS = 10_000;

    private final Server server;
    private final ServerConnector connector;
    private final Path dir;
    private volatile boolean running = true;
    /** Counts reported changes of the folder; viewers wait on it. */
    private final Object changes = new Object();
    private long changeCount;
    private final Thread watcher;

    private LiveServer(Path dir, InetSocketAddress bind) {
        this.dir = dir;
        QueuedThreadPool pool = new QueuedThreadPool(64, 4);
        pool.setName("zweep-live");
        pool.setDaemon(true);
        server = new Server(pool);
        connector = new ServerConnector(server, 1, 1);
        connector.setHost(bind.getHostString());
        connector.setPort(bind.getPort());
        server.addConnector(connector);
        server.setHandler(new Handler.Abstract() {
            @Override
            public boolean handle(Request request, Response response, Callback callback) throws Exception {
                return LiveServer.this.handle(request, response, callback);
            }
        });
        server.setStopTimeout(2000);
        watcher = new Thread(this::watch, "zweep-live-watch");
        watcher.setDaemon(true);
    }

    /** Wakes the viewers whenever the folder reports a change, until {@link #close()}. */
    private void watch() {
        try (WatchService ws = dir.getFileSystem().newWatchService()) {
            dir.register(ws, StandardWatchEventKinds.ENTRY_CREATE, StandardWatchEventKinds.ENTRY_MODIFY);
            while (running) {
                WatchKey key = ws.take();
                key.pollEvents();
                key.reset();
                changed();
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        } catch (IOException | java.nio.file.ClosedWatchServiceException | UnsupportedOperationException e) {
            // no notifications: the viewers fall back to reading every POLL_MS
        }
    }

    private void changed() {
        synchronized (changes) {
            changeCount++;
            changes.notifyAll();
        }
    }

    private long changeCount() {
        synchronized (changes) {
            return changeCount;
        }
    }

    /** Waits until a change after {@code seen} is reported, at most {@link #POLL_MS}. */
    private void awaitChange(long seen) throws InterruptedException {
        synchronized (changes) {
            if (changeCount == seen && running) {
                changes.wait(POLL_MS);
            }
        }
    }

    /**
     * Serves the live view of run folder {@code dir} on {@code bind} (use port 0 for a free one;
     * the loopback address unless the operator asked otherwise).
     */
    public static LiveServer start(Path dir, InetSocketAddress bind) {
        LiveServer s = new LiveServer(dir, bind);
        try {
            s.server.start();
            s.watcher.start();
        } catch (Exception e) {
            throw new UncheckedIOException(new IOException("cannot serve the live view on " + bind + ": "
                    + e.getMessage(), e));
        }
        return s;
    }

    /** The page's address, e.g. {@code http://127.0.0.1:41234/}. */
    public String url() {
        String host = connector.getHost();
        if (host.contains(":")) {
            host = "[" + host + "]";
        }
        return "http://" + host + ":" + connector.getLocalPort() + "/";
    }

    private boolean handle(Request request, Response response, Callback callback) throws Exception {
        String path = Request.getPathInContext(request);
        response.getHeaders().put(HttpHeader.CACHE_CONTROL, "no-store");
        switch (path) {
            case "/", "/index.html" -> resource(response, callback, "org/zweep/runner/live/live.html",
                    "text/html; charset=utf-8");
            case "/uplot.js" -> resource(response, callback, webjar("dist/uPlot.iife.min.js"),
                    "text/javascript; charset=utf-8");
            case "/uplot.css" -> resource(response, callback, webjar("dist/uPlot.min.css"), "text/css; charset=utf-8");
            case "/events" -> events(request, response, callback);
            case "/answer" -> {
                if (!"POST".equals(request.getMethod())) {
                    Response.writeError(request, response, callback, 405);
                    return true;
                }
                String body = Content.Source.asString(request, StandardCharsets.UTF_8);
                String id = body.startsWith("id=") ? java.net.URLDecoder.decode(body.substring(3), StandardCharsets.UTF_8)
                        : body.strip();
                if (!id.matches("[0-9a-fA-F-]{8,64}")) {
                    Response.writeError(request, response, callback, 400);
                    return true;
                }
                LivePrompter.answer(dir, id);
                response.getHeaders().put(HttpHeader.CONTENT_TYPE, "text/plain; charset=utf-8");
                Content.Sink.write(response, true, "ok\n", callback);
            }
            case "/favicon.ico" -> {
                response.setStatus(204);
                callback.succeeded();
            }
            default -> Response.writeError(request, response, callback, 404);
        }
        return true;
    }

    private static String webjar(String file) {
        String base = "META-INF/maven/org.webjars.npm/uplot/pom.properties";
        try (InputStream in = LiveServer.class.getClassLoader().getResourceAsStream(base)) {
            Properties p = new Properties();
            if (in != null) {
                p.load(in);
            }
            return "META-INF/resources/webjars/uplot/" + p.getProperty("version", "missing") + "/" + file;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static void resource(Response response, Callback callback, String name, String type) throws IOException {
        try (InputStream in = LiveServer.class.getClassLoader().getResourceAsStream(name)) {
            if (in == null) {
                response.setStatus(500);
                Content.Sink.write(response, true, "missing from the jar: " + name, callback);
                return;
            }
            byte[] b = in.readAllBytes();
            response.getHeaders().put(HttpHeader.CONTENT_TYPE, type);
            response.write(true, ByteBuffer.wrap(b), callback);
        }
    }

    /** Streams the events file from the viewer's last event id (a byte offset) on, until the viewer or the server goes. */
    private void events(Request request, Response response, Callback callback) {
        long offset = 0;
        String last = request.getHeaders().get("Last-Event-ID");
        if (last != null && last.matches("[0-9]{1,15}")) {
            offset = Long.parseLong(last);
        }
        response.setStatus(200);
        response.getHeaders().put(HttpHeader.CONTENT_TYPE, "text/event-stream; charset=utf-8");
        EventTail tail = new EventTail(dir.resolve(EventLog.FILE), offset);
        long lastWrite = System.currentTimeMillis();
        try {
            send(response, "retry: 500\n\n");
            while (running) {
                long seen = changeCount();
                StringBuilder chunk = new StringBuilder();
                for (EventTail.Line line : tail.read()) {
                    chunk.append("id: ").append(line.end()).append("\ndata: ").append(line.text()).append("\n\n");
                }
                if (chunk.length() > 0) {
                    send(response, chunk.toString());
                    lastWrite = System.currentTimeMillis();
                } else if (System.currentTimeMillis() - lastWrite > HEARTBEAT_MS) {
                    send(response, ": still here\n\n");
                    lastWrite = System.currentTimeMillis();
                } else {
                    awaitChange(seen);
                }
            }
            callback.succeeded();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            callback.failed(e);
        } catch (Exception e) {
            callback.failed(e); // the viewer went away
        }
    }

    private static void send(Response response, String text) throws Exception {
        FutureCallback cb = new FutureCallback();
        response.write(false, ByteBuffer.wrap(text.getBytes(StandardCharsets.UTF_8)), cb);
        cb.get(10, TimeUnit.SECONDS);
    }

    /** Whether {@code line} of an events file is the end of a run. */
    static boolean isFinish(JsonNode event) {
        return "finished".equals(event.path("type").asText());
    }

    /** Stops serving: open streams end, the port is released. */
    @Override
    public void close() {
        running = false;
        watcher.interrupt();
        changed();
        try {
            server.stop();
        } catch (Exception e) {
            // stopping is best effort
        }
    }
}
