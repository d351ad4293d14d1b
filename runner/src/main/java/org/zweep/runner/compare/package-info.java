/** Comparing runs: the same checks and fitted values side by side, with differences and plots overlaid. */
package org.zweep.runner.compare;
