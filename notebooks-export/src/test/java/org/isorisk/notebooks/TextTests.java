package org.isorisk.notebooks;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.isorisk.notebooks.report.Table;
import org.junit.jupiter.api.Test;

class TextTests {

    @Test
    void htmlEscapingTurnsTheFiveSignificantCharactersIntoEntities() {
        assertEquals("&lt;script&gt;alert(&#39;x&#39;)&lt;/script&gt; &amp; &quot;q&quot;",
                Text.html("<script>alert('x')</script> & \"q\""));
    }

    @Test
    void markdownEscapingBackslashesEveryInlineMarkupCharacter() {
        // CommonMark 0.30 section 2.4: any ASCII punctuation may be backslash-escaped and then reads literally.
        assertEquals("\\*Bold\\* \\_it\\_ \\$x^2\\$ \\[link\\](u) \\| pipe \\`code\\` \\~\\~s\\~\\~",
                Text.markdown("*Bold* _it_ $x^2$ [link](u) | pipe `code` ~~s~~"));
        assertEquals("&lt;b&gt;x&lt;/b&gt; &amp;amp;", Text.markdown("<b>x</b> &amp;"));
    }

    @Test
    void markdownEscapingStopsAddressesFromBecomingLinks() {
        assertEquals("see http&#58;//x.invalid, www&#46;x.invalid, a&#64;b.invalid and 10:30",
                Text.markdown("see http://x.invalid, www.x.invalid, a@b.invalid and 10:30"));
    }

    @Test
    void escapedNamesRenderAsTheirOwnTextInNbconvertsMarkdown() {
        // Outside reference: the Markdown renderer of Debian's nbconvert (the one `jupyter nbconvert` uses).
        ExternalTools.assumeModules("jupyter-nbconvert", "nbconvert");
        List<String> names = new ArrayList<>(Fixtures.HOSTILE);
        names.addAll(List.of("# Heading", "- item", "12. ordered", "> quote", "see http://x.invalid", "www.x.invalid",
                "a@b.invalid", "**strong** __u__", "<img src=x onerror=alert(1)>", "1) x", "+ plus", "a\\b"));
        StringBuilder src = new StringBuilder("""
                import html, json, re, sys
                from nbconvert.filters.markdown_mistune import markdown2html_mistune
                names = json.loads(sys.stdin.read())
                out = []
                for n in names:
                    h = markdown2html_mistune("- " + n)
                    tags = sorted(set(re.findall(r"<([a-z0-9]+)", h)))
                    text = html.unescape(re.sub(r"<[^>]+>", "", h)).strip().replace("\\\\$", "$")
                    out.append([tags, text])
                print(json.dumps(out))
                """);
        List<String> escaped = names.stream().map(Text::markdown).toList();
        ExternalTools.Run r = ExternalTools.runWithInput(Path.of("."), 60, toJson(escaped), ExternalTools.PYTHON, "-c",
                src.toString());
        assertEquals(0, r.exit(), r.err());
        com.fasterxml.jackson.databind.JsonNode back;
        try {
            back = new com.fasterxml.jackson.databind.ObjectMapper().readTree(r.out());
        } catch (java.io.IOException e) {
            throw new AssertionError(e);
        }
        for (int i = 0; i < names.size(); i++) {
            assertEquals("[\"li\",\"ul\"]", back.get(i).get(0).toString(), "only the list item: " + names.get(i));
            // MathJax (processEscapes) shows \$ as $; the renderer keeps the backslash for it
            assertEquals(names.get(i), back.get(i).get(1).asText(), "reads as given: " + names.get(i));
        }
    }

    private static String toJson(List<String> xs) {
        try {
            return new com.fasterxml.jackson.databind.ObjectMapper().writeValueAsString(xs);
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new AssertionError(e);
        }
    }

    @Test
    void markdownEscapingStopsNamesFromOpeningBlocksAtTheStartOfALine() {
        assertEquals("\\# Heading", Text.markdown("# Heading"));
        assertEquals("\\- item", Text.markdown("- item"));
        assertEquals("\\+ item", Text.markdown("+ item"));
        assertEquals("12\\. ordered", Text.markdown("12. ordered"));
        assertEquals("&gt; quote", Text.markdown("> quote"));
        assertEquals("Inflation-Linked Bonds", Text.markdown("Inflation-Linked Bonds"), "inner hyphens stay as they are");
        assertEquals("one two", Text.markdown("one\ntwo"), "a line break would end the list item");
    }

    @Test
    void pythonLiteralsReadBackAsTheSameStringInPython() {
        ExternalTools.assumeModules("python3", "ast");
        List<String> samples = new ArrayList<>(Fixtures.HOSTILE);
        samples.add("tab\tnew\nline \u00e9\u4e2d\ud83d\ude00");
        StringBuilder src = new StringBuilder("import sys\nsys.stdout.reconfigure(encoding='utf-8')\n");
        for (String s : samples) {
            src.append("print(ascii(").append(Text.python(s)).append("))\n");
        }
        ExternalTools.Run r = ExternalTools.run(Path.of("."), 60, ExternalTools.PYTHON, "-c", src.toString());
        assertEquals(0, r.exit(), r.err());
        StringBuilder expected = new StringBuilder();
        for (String s : samples) {
            expected.append(pythonAscii(s)).append('\n');
        }
        assertEquals(expected.toString(), r.out());
        for (String s : samples) {
            assertTrue(Text.python(s).chars().allMatch(c -> c >= 0x20 && c < 0x7f), "ASCII source");
        }
    }

    /** Python's ascii() of a str, for the strings above: single quotes unless the text holds one. */
    private static String pythonAscii(String s) {
        char q = s.indexOf('\'') >= 0 && s.indexOf('"') < 0 ? '"' : '\'';
        StringBuilder b = new StringBuilder().append(q);
        for (int i = 0; i < s.length(); i++) {
            int cp = s.codePointAt(i);
            if (Character.charCount(cp) == 2) {
                i++;
            }
            if (cp == '\\') {
                b.append("\\\\");
            } else if (cp == q) {
                b.append('\\').append((char) cp);
            } else if (cp == '\t') {
                b.append("\\t");
            } else if (cp == '\n') {
                b.append("\\n");
            } else if (cp < 0x20 || cp == 0x7f) {
                b.append(String.format("\\x%02x", cp));
            } else if (cp < 0x7f) {
                b.append((char) cp);
            } else if (cp <= 0xff) {
                b.append(String.format("\\x%02x", cp));
            } else if (cp <= 0xffff) {
                b.append(String.format("\\u%04x", cp));
            } else {
                b.append(String.format("\\U%08x", cp));
            }
        }
        return b.append(q).toString();
    }

    @Test
    void numbersAreShownExactlyAsPythonFormatsThem() {
        // Outside reference: Python's format specification mini-language, run by the Debian interpreter with
        // the notebook's own format lambdas.
        ExternalTools.assumeModules("python3", "json");
        double[] values = {0, -0.0, 0.065, 1.005, 0.125, 0.00125, 2.5, 3.5, -1e-12, -0.004999, 0.5, 1234567.5,
                -1_250_000.49, 1e-5, 0.000123456789, 123456789, 0.1 + 0.2, -0.0123456789, 1e21, 7.0 / 3, 99.995,
                -0.005, 0.015, 1e-300, 1.5e300};
        List<String> kinds = List.of("percent", "decimal", "number", "amount");
        StringBuilder src = new StringBuilder("""
                def _unsigned_zero(text):
                    return text[1:] if text.startswith("-") and not any(d in text for d in "123456789") else text
                FORMATS = {
                    "percent": lambda v: _unsigned_zero(f"{v * 100:.2f}") + " %",
                    "decimal": lambda v: _unsigned_zero(f"{v:.2f}"),
                    "number": lambda v: f"{v:.6g}",
                    "amount": lambda v: _unsigned_zero(f"{v:,.0f}"),
                }
                for v in [""");
        for (double v : values) {
            src.append("float.fromhex('").append(Double.toHexString(v)).append("'),");
        }
        src.append("]:\n    print('|'.join(FORMATS[k](v) for k in ").append(pyList(kinds)).append("))\n");
        ExternalTools.Run r = ExternalTools.run(Path.of("."), 60, ExternalTools.PYTHON, "-c", src.toString());
        assertEquals(0, r.exit(), r.err());
        String[] lines = r.out().split("\n");
        assertEquals(values.length, lines.length);
        for (int i = 0; i < values.length; i++) {
            Table.Cell c = new Table.Cell.Number(values[i]);
            String java = String.join("|", Text.display(c, Table.Format.PERCENT), Text.display(c, Table.Format.DECIMAL),
                    Text.display(c, Table.Format.NUMBER), Text.display(c, Table.Format.AMOUNT));
            assertEquals(lines[i], java, "value " + values[i]);
        }
    }

    private static String pyList(List<String> xs) {
        return "[" + String.join(", ", xs.stream().map(Text::python).toList()) + "]";
    }

    @Test
    void generalFormatFollowsPythonsSignificantDigitRule() {
        // Python docs, format spec "g": fixed for exponents −4 ≤ exp < p, else scientific; zeros stripped
        // (values from memory of Python's behaviour, checked against Python in the test above).
        assertEquals("0.000123457", Text.general(0.000123456789, 6));
        assertEquals("1e-05", Text.general(1e-5, 6));
        assertEquals("1.23457e+06", Text.general(1234567, 6));
        assertEquals("123457", Text.general(123456.7, 6));
        assertEquals("0.5", Text.general(0.5, 6));
        assertFalse(Text.general(1e21, 6).contains("E"));
    }

    @Test
    void percentAndAmountThatRoundToZeroShowNoMinusSign() {
        assertEquals("0.00 %", Text.display(new Table.Cell.Number(-1e-12), Table.Format.PERCENT));
        assertEquals("0", Text.display(new Table.Cell.Number(-0.3), Table.Format.AMOUNT));
        assertEquals("-0.01 %", Text.display(new Table.Cell.Number(-0.0001), Table.Format.PERCENT));
        assertEquals("", Text.display(new Table.Cell.Number(Double.NaN), Table.Format.PERCENT));
    }
}
