/**
 * Crash-safe run folders: the {@code points.csv} writer (one row appended, flushed and synced per
 * point), the {@code run.json} manifest, and the reader that tells a resumed run which points are
 * already on disk.
 */
package org.zweep.runner.results;
