package org.isorisk.notebooks;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.isorisk.engine.explain.Caution;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class NotebookWriterTests {

    private static JsonNode written(PackContent c) throws IOException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        NotebookWriter.write(c, out);
        return new ObjectMapper().readTree(out.toByteArray());
    }

    private static String source(JsonNode cell) {
        StringBuilder b = new StringBuilder();
        cell.get("source").forEach(l -> b.append(l.asText()));
        return b.toString();
    }

    private static Path pack(Path dir, PackContent c) {
        try {
            Files.createDirectories(dir);
        } catch (IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
        Path target = dir.resolve("pack");
        Fixtures.write(target, c);
        return target;
    }

    @Test
    void theNotebookIsFormatFourPointFiveWithAPythonKernel() throws IOException {
        JsonNode nb = written(Fixtures.content(Fixtures.PLAIN));
        assertEquals(4, nb.get("nbformat").asInt());
        assertEquals(5, nb.get("nbformat_minor").asInt());
        assertEquals("python3", nb.at("/metadata/kernelspec/name").asText());
        assertEquals("python", nb.at("/metadata/language_info/name").asText());
        assertEquals(Caution.TEXT, nb.at("/metadata/isorisk/caution").asText());
    }

    @Test
    void everyCellHasAUniqueIdMetadataAndTheFieldsItsTypeNeeds() throws IOException {
        JsonNode nb = written(Fixtures.content(Fixtures.HOSTILE));
        Set<String> ids = new HashSet<>();
        Pattern idRule = Pattern.compile("[a-zA-Z0-9_-]{1,64}"); // nbformat.v4.5.schema.json, cell id
        int lastCount = 0;
        for (JsonNode cell : nb.get("cells")) {
            String id = cell.get("id").asText();
            assertTrue(idRule.matcher(id).matches(), id);
            assertTrue(ids.add(id), "duplicate id " + id);
            assertTrue(cell.get("metadata").isObject(), id);
            assertTrue(cell.get("source").isArray(), id);
            if (cell.get("cell_type").asText().equals("code")) {
                assertTrue(cell.get("execution_count").isInt(), id);
                int count = cell.get("execution_count").asInt();
                assertTrue(count > lastCount, "execution counts increase");
                lastCount = count;
                for (JsonNode out : cell.get("outputs")) {
                    assertTrue(out.get("metadata").isObject(), id);
                    if (out.get("output_type").asText().equals("execute_result")) {
                        assertEquals(count, out.get("execution_count").asInt());
                    }
                }
            } else {
                assertEquals("markdown", cell.get("cell_type").asText());
                assertFalse(cell.has("outputs"), "markdown cells carry no outputs");
            }
        }
    }

    @Test
    void theTitleCellNamesTheFundTheDateAndTheCaution() throws IOException {
        JsonNode title = written(Fixtures.content(Fixtures.PLAIN)).get("cells").get(0);
        String s = source(title);
        assertTrue(s.startsWith("# Cash Pension Fund\n"), s);
        assertTrue(s.contains("2025-06-30"), s);
        assertTrue(s.contains(Text.markdown(Caution.TEXT)), s);
    }

    @Test
    void chartsAreEmbeddedAsPngWithSvgAlongside() throws IOException {
        PackContent c = Fixtures.content(Fixtures.PLAIN);
        JsonNode nb = written(c);
        int images = 0;
        for (JsonNode cell : nb.get("cells")) {
            for (JsonNode out : cell.path("outputs")) {
                JsonNode data = out.get("data");
                if (data.has("image/png")) {
                    images++;
                    assertEquals("display_data", out.get("output_type").asText());
                    byte[] png = java.util.Base64.getDecoder().decode(data.get("image/png").asText());
                    assertEquals((byte) 0x89, png[0]);
                    assertEquals('P', png[1]);
                    assertTrue(data.get("image/svg+xml").asText().startsWith("<svg"));
                }
            }
        }
        assertEquals(c.charts().size(), images);
    }

    @Test
    void everyBindingConstraintIsWrittenAsItsSentence() throws IOException {
        PackContent c = Fixtures.content(Fixtures.PLAIN);
        String all = String.join("\n", cellsText(written(c)));
        for (PackContent.Binding b : c.binding()) {
            assertTrue(all.contains("- " + Text.markdown(b.sentence())), b.sentence());
        }
    }

    private static List<String> cellsText(JsonNode nb) {
        List<String> out = new ArrayList<>();
        nb.get("cells").forEach(cell -> out.add(source(cell)));
        return out;
    }

    @Test
    void hostileNamesNeverReachMarkdownOrHtmlUnescaped() throws IOException {
        JsonNode nb = written(Fixtures.content(Fixtures.HOSTILE));
        for (JsonNode cell : nb.get("cells")) {
            String s = source(cell);
            if (cell.get("cell_type").asText().equals("markdown")) {
                assertFalse(s.contains("<script>"), s);
                assertFalse(s.contains("[link](http"), s);
                assertFalse(Pattern.compile("(?<!\\\\)\\$").matcher(s).find(), "every $ escaped: " + s);
                assertFalse(s.contains("http://"), s);
            } else {
                assertTrue(s.chars().allMatch(ch -> ch == '\n' || (ch >= 0x20 && ch < 0x7f)), "code is ASCII: " + s);
                for (String name : Fixtures.HOSTILE) {
                    // input text reaches code only as an escaped Python literal (TextTests reads them back)
                    assertFalse(s.replace(Text.python(name), "").contains(name.substring(0, 4)), "raw in code: " + s);
                }
            }
            for (JsonNode out : cell.path("outputs")) {
                String html = out.get("data").path("text/html").asText("");
                assertFalse(html.contains("<script>"), html);
                assertFalse(html.contains("\"Quoted\""), html);
            }
        }
    }

    @Test
    void theNotebookValidatesAgainstTheNbformatSchemaInStrictMode(@TempDir Path dir) {
        for (List<String> names : List.of(Fixtures.PLAIN, Fixtures.HOSTILE)) {
            Path nb = pack(dir.resolve(names.size() + "n"), Fixtures.content(names)).resolve(PackLayout.NOTEBOOK);
            ExternalTools.Run r = ExternalTools.validate(nb);
            assertEquals(0, r.exit(), r.both());
            assertTrue(r.out().startsWith("valid nbformat 4.5"), r.out());
        }
    }

    @Test
    void theStrictValidatorRejectsANotebookWithAMissingCellId(@TempDir Path dir) throws IOException {
        // Proves the check can fail: without -W error, nbformat would add the id and call the notebook valid.
        JsonNode nb = NotebookWriter.build(Fixtures.content(Fixtures.PLAIN));
        ((com.fasterxml.jackson.databind.node.ObjectNode) nb.get("cells").get(1)).remove("id");
        Path file = dir.resolve("broken.ipynb");
        new ObjectMapper().writeValue(file.toFile(), nb);
        ExternalTools.Run r = ExternalTools.validate(file);
        assertTrue(r.exit() != 0, "a missing id must fail strict validation: " + r.both());
    }

    @Test
    void nbconvertRendersTheNotebookWithTheCautionTheImagesAndTheNamesReadable(@TempDir Path dir) throws IOException {
        Path folder = pack(dir, Fixtures.content(Fixtures.HOSTILE));
        Path html = ExternalTools.html(folder.resolve(PackLayout.NOTEBOOK), dir.resolve("html"));
        String page = Files.readString(html, StandardCharsets.UTF_8);
        assertTrue(page.contains(Text.html(Caution.TEXT)) || page.contains(Caution.TEXT), "caution in the page");
        PackContent c = Fixtures.content(Fixtures.HOSTILE);
        for (PackContent.Chart chart : c.charts()) {
            String img = "<img src=\"data:image/png;base64," + java.util.Base64.getEncoder().encodeToString(chart.png())
                    + "\" alt=\"" + Text.html(chart.title()) + "\"";
            assertTrue(page.contains(img), "chart " + chart.name() + " shown as its PNG");
        }
        assertTrue(page.contains("&lt;script&gt;alert("), "a hostile name reads as text");
        assertFalse(page.contains("<script>alert("), "and never runs");
        assertFalse(page.contains("href=\"http://example.invalid\""), "a name never becomes a link");
    }

    @Test
    void nbclientRunsEveryCodeCellAndReproducesTheStoredTables(@TempDir Path dir) throws IOException {
        PackContent c = Fixtures.content(Fixtures.HOSTILE);
        Path folder = pack(dir, c);
        Path executed = ExternalTools.execute(folder.resolve(PackLayout.NOTEBOOK), dir.resolve("executed.ipynb"));
        JsonNode before = new ObjectMapper().readTree(folder.resolve(PackLayout.NOTEBOOK).toFile());
        JsonNode after = new ObjectMapper().readTree(executed.toFile());
        int compared = 0;
        for (int i = 0; i < before.get("cells").size(); i++) {
            JsonNode b = before.get("cells").get(i);
            JsonNode a = after.get("cells").get(i);
            for (JsonNode out : a.path("outputs")) {
                assertFalse(out.get("output_type").asText().equals("error"), "cell " + b.get("id") + " failed");
            }
            if (b.get("id").asText().startsWith("table-")) {
                String stored = b.get("outputs").get(0).get("data").get("text/html").asText();
                String fresh = htmlOf(a.get("outputs").get(0).get("data").get("text/html"));
                assertEquals(cellTexts(stored), cellTexts(fresh), "table " + b.get("id"));
                compared++;
            }
        }
        assertEquals(c.tables().size(), compared);
    }

    private static String htmlOf(JsonNode n) {
        if (n.isArray()) {
            StringBuilder b = new StringBuilder();
            n.forEach(l -> b.append(l.asText()));
            return b.toString();
        }
        return n.asText();
    }

    private static final Pattern CELL = Pattern.compile("<t[hd][^>]*>(.*?)</t[hd]>", Pattern.DOTALL);

    /** The texts of the th/td cells, unescaped (pandas escapes only & < >; the pack escapes quotes as well). */
    private static List<String> cellTexts(String html) {
        List<String> out = new ArrayList<>();
        Matcher m = CELL.matcher(html);
        while (m.find()) {
            out.add(m.group(1).replace("&lt;", "<").replace("&gt;", ">").replace("&quot;", "\"").replace("&#39;", "'")
                    .replace("&amp;", "&").trim());
        }
        return out;
    }
}
