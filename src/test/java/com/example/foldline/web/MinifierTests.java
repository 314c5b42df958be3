package com.example.foldline.web;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The minifier keeps every token and drops only what the language lets go (ECMA-262 14th edition: comments,
 * whitespace, and line breaks where no semicolon can be inserted; CSS Syntax Module Level 3 for style sheets).
 * Node's own parser ({@code node --check}) is the outside judge that each minified module of the UI and the tag is
 * still valid JavaScript; the browser tests then run the UI as served, minified.
 */
class MinifierTests {

    @Test
    void commentsAndIndentationGoTokensStay() {
        String src = """
                // a module
                import { h } from './dom.js';
                /** Doc comment. */
                export function f(a, b) {
                  const x = a + +b;      // unary plus kept apart
                  const y = a - -b;
                  return x / 2 + y;
                }
                """;
        assertThat(Minifier.js(src)).isEqualTo(
                "import{h}from'./dom.js';export function f(a,b){const x=a+ +b;const y=a- -b;return x/2+y;}");
    }

    @Test
    void stringsTemplatesAndRegularExpressionsAreCopiedVerbatim() {
        String src = "const s = 'a  // not a comment';\n"
                + "const t = `x  ${ {a: 1}.a + `in ${ 'ner' }` }  y`;\n"
                + "const r = /[/]\\/  +/g.test(s) ? s.replace(/ +/g, ' ') : s / 2 / 3;\n"
                + "const q = \"it's /* no */ comment\";";
        assertThat(Minifier.js(src)).isEqualTo("const s='a  // not a comment';"
                + "const t=`x  ${ {a: 1}.a + `in ${ 'ner' }` }  y`;"
                + "const r=/[/]\\/  +/g.test(s)?s.replace(/ +/g,' '):s/2/3;"
                + "const q=\"it's /* no */ comment\";");
    }

    @Test
    void aRegularExpressionAfterAKeywordIsNotADivision() {
        assertThat(Minifier.js("function f(x) {\n  return /a b/.test(x);\n}"))
                .isEqualTo("function f(x){return/a b/.test(x);}");
        assertThat(Minifier.js("if (typeof /x/ === 'object') y = a / b / c;"))
                .isEqualTo("if(typeof/x/==='object')y=a/b/c;");
    }

    @Test
    void lineBreaksStayWhereASemicolonCouldBeInserted() {
        // ECMA-262 12.10.1: "return\nx" returns undefined; "a\n++b" increments b; statements without semicolons
        assertThat(Minifier.js("function f() {\n  return\n  x;\n}")).isEqualTo("function f(){return\nx;}");
        assertThat(Minifier.js("a\n++b")).isEqualTo("a\n++b");
        assertThat(Minifier.js("a++\nb")).isEqualTo("a++\nb");
        assertThat(Minifier.js("let a = 1\nlet b = 2")).isEqualTo("let a=1\nlet b=2");
        // and go where none can: after an operator, before a dot or a closing bracket
        assertThat(Minifier.js("const a = b\n  .map(f)\n  .filter(g);\nx = [\n  1,\n  2\n];"))
                .isEqualTo("const a=b.map(f).filter(g);x=[1,2];");
    }

    @Test
    void numbersKeepTheirExponentsAndStayApartFromADot() {
        assertThat(Minifier.js("x = 1e-3 + 0x1F - 2.5E+2;")).isEqualTo("x=1e-3+0x1F-2.5E+2;");
        assertThat(Minifier.js("y = 1 .toFixed(2);")).isEqualTo("y=1 .toFixed(2);");
    }

    @Test
    void unterminatedInputIsRefusedNotGuessed() {
        assertThatThrownBy(() -> Minifier.js("const s = 'open")).hasMessageContaining("unterminated string");
        assertThatThrownBy(() -> Minifier.js("x = `open ${a}")).hasMessageContaining("unterminated template");
        assertThatThrownBy(() -> Minifier.js("/* open")).hasMessageContaining("unterminated comment");
    }

    @Test
    void styleSheetsLoseCommentsAndSpacesButNotSelectorMeaning() {
        String css = "/* palette */\n:root {\n  --ink: #1d2a33;\n}\n\n.panel > h2,\n.tile :is(a, b) {\n"
                + "  margin: 0 auto;\n  content: \"a  b\";\n  width: calc(100% - 2px);\n}\n";
        assertThat(Minifier.css(css)).isEqualTo(":root{--ink:#1d2a33}.panel>h2,.tile :is(a,b){margin:0 auto;"
                + "content:\"a  b\";width:calc(100% - 2px)}");
    }

    @Test
    void everyModuleOfTheUiAndTheTagIsStillValidJavaScriptOnceMinified(@TempDir Path dir)
            throws IOException, InterruptedException {
        List<Path> sources = new ArrayList<>();
        try (var files = Files.walk(Path.of("frontend"))) {
            files.filter(p -> p.toString().endsWith(".js") && !p.toString().contains("/test/")).forEach(sources::add);
        }
        assertThat(sources).hasSizeGreaterThan(20);
        long before = 0;
        long after = 0;
        for (Path source : sources) {
            String text = Files.readString(source);
            String small = Minifier.js(text);
            before += text.length();
            after += small.length();
            boolean module = !source.getFileName().toString().equals("tag.js");
            Path out = dir.resolve(source.toString().replace('/', '_') + (module ? ".mjs" : ".js"));
            Files.writeString(out, small);
            Process node = new ProcessBuilder("node", "--check", out.toString()).redirectErrorStream(true).start();
            assertThat(node.waitFor(60, TimeUnit.SECONDS)).isTrue();
            assertThat(node.exitValue()).as(source + ": " + new String(node.getInputStream().readAllBytes()))
                    .isZero();
        }
        assertThat(after).isLessThan(before * 4 / 5);
    }
}
