/**
 * The committee pack's notebook: the content value ({@link org.isorisk.notebooks.PackContent}), typed tables
 * ({@link org.isorisk.notebooks.Table}) and their CSV form with spreadsheet formula neutralising
 * ({@link org.isorisk.notebooks.Csv}), escaping ({@link org.isorisk.notebooks.Text}) and the nbformat 4.5
 * writer ({@link org.isorisk.notebooks.NotebookWriter}). Writers take the stream they write to; the names of
 * the files inside a pack folder live in {@link org.isorisk.notebooks.PackLayout}.
 */
package org.isorisk.notebooks;
