/**
 * Committee-pack charts drawn with XChart: the efficient frontier, weights along it, the marginal risk of the
 * return target, risk contributions and the stress overlay. Everything here is presentation: charts take values
 * the engine computed (frontiers, solutions, risk decompositions) and return
 * {@link org.isorisk.notebooks.chart.Figure} objects or write them to a caller-supplied
 * {@link java.io.OutputStream}; they run no analysis and choose no file (the command line writes the file).
 * {@link org.isorisk.notebooks.chart.Charts} is the front door.
 *
 * <p>Look: one colour-blind-safe palette ({@link org.isorisk.notebooks.chart.Palette}, after Okabe and Ito), one
 * colour per asset for a whole run ({@link org.isorisk.notebooks.chart.AssetColours}), percent ticks formatted with
 * {@link java.util.Locale#ROOT}, and on every chart a footnote with the caution, the as-of date of the
 * assumptions and a short hash of the inputs ({@link org.isorisk.notebooks.chart.ChartContext}).
 */
package org.isorisk.notebooks.chart;
