/**
 * The self-contained HTML report of a run folder ({@code report.html}): CSS and plots inline, no
 * external reference of any kind, readable without a network.
 */
package org.zweep.runner.report;
