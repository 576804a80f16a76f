/**
 * The committee pack's notebook: the content value ({@link org.isorisk.notebooks.PackContent}), escaping for
 * HTML, Markdown and Python ({@link org.isorisk.notebooks.Text}), the nbformat 4.5 writer
 * ({@link org.isorisk.notebooks.NotebookWriter}) and the tables' schema with the notebook's Python helper
 * ({@link org.isorisk.notebooks.TableSchema}). Writers take the stream they write to; the names of the files
 * inside a pack folder live in {@link org.isorisk.notebooks.PackLayout}. Tables and their CSV form are in
 * {@code notebooks.report}, charts in {@code notebooks.chart}, the pack's composition in {@code notebooks.pack}.
 */
package org.isorisk.notebooks;
