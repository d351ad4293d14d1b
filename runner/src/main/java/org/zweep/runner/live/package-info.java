/**
 * The live view of a run: its event stream ({@code events.jsonl}), the prompter that the page can
 * answer, and the embedded HTTP server (Jetty) that serves the page with its charting library
 * (uPlot, from the jar) and streams the events to every viewer.
 */
package org.zweep.runner.live;
