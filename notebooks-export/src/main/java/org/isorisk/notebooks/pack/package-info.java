/**
 * The committee pack's composition: the pack file's value ({@link org.isorisk.notebooks.pack.PackSpec}), the
 * results of the pack's analyses as the command line hands them over ({@link org.isorisk.notebooks.pack.PackResults}),
 * the layout of those results as tables, sentences and a run record
 * ({@link org.isorisk.notebooks.pack.PackComposer}) and the pack's charts
 * ({@link org.isorisk.notebooks.pack.PackCharts}, a {@link org.isorisk.notebooks.pack.ChartMaker}). Nothing here
 * runs an analysis, reads a file or chooses where anything is written.
 */
package org.isorisk.notebooks.pack;
