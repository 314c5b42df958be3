package com.example.foldline.web;

/**
 * Removes comments and the whitespace a browser does not need from the UI's JavaScript modules and style sheets, so
 * the code the browser downloads is smaller than the code we read. It only removes: every token of the source is
 * kept, in order and unchanged (strings, template literals and regular expressions verbatim), so the program is the
 * same program. Line breaks are kept wherever automatic semicolon insertion could depend on them (ECMA-262, 14th
 * edition, section 12.10), which our code, written with semicolons, rarely needs.
 *
 * <p>It is a tokenizer for the subset of ECMAScript our own files use; it is not meant for third-party code
 * (Chart.js comes minified from its webjar). A slash is read as the start of a regular expression where the previous
 * token cannot end an expression (after an operator, an opening bracket, a comma or a keyword such as
 * {@code return}), the usual rule of JavaScript minifiers; a regular expression right after a closing brace is read
 * as a division, which our code does not contain.
 */
final class Minifier {

    private static final java.util.Set<String> KEYWORDS_BEFORE_EXPRESSION = java.util.Set.of("return", "typeof",
            "instanceof", "in", "of", "new", "delete", "void", "throw", "case", "do", "else", "yield", "await");

    private Minifier() {
    }

    /** The module without comments and needless whitespace. */
    static String js(String source) {
        return new Js(source).run();
    }

    /** The style sheet without comments and needless whitespace. */
    static String css(String source) {
        StringBuilder out = new StringBuilder(source.length());
        int n = source.length();
        boolean space = false;
        for (int i = 0; i < n; ) {
            char c = source.charAt(i);
            if (c == '/' && i + 1 < n && source.charAt(i + 1) == '*') {
                int end = source.indexOf("*/", i + 2);
                i = end < 0 ? n : end + 2;
                space = true;
            } else if (Character.isWhitespace(c)) {
                space = true;
                i++;
            } else if (c == '"' || c == '\'') {
                int end = stringEnd(source, i);
                emitCssSpace(out, space, c);
                out.append(source, i, end);
                space = false;
                i = end;
            } else {
                if (c == '}' && !out.isEmpty() && out.charAt(out.length() - 1) == ';') {
                    out.setLength(out.length() - 1);
                }
                emitCssSpace(out, space, c);
                out.append(c);
                space = false;
                i++;
            }
        }
        return out.toString();
    }

    private static void emitCssSpace(StringBuilder out, boolean space, char next) {
        if (!space || out.isEmpty()) {
            return;
        }
        char prev = out.charAt(out.length() - 1);
        if ("{};,>:".indexOf(prev) >= 0 || "{};,>".indexOf(next) >= 0) {
            return;
        }
        out.append(' ');
    }

    /** Index just past the string literal that opens at {@code start}. */
    private static int stringEnd(String s, int start) {
        char quote = s.charAt(start);
        int i = start + 1;
        while (i < s.length()) {
            char c = s.charAt(i);
            if (c == '\\') {
                i += 2;
            } else if (c == quote) {
                return i + 1;
            } else {
                i++;
            }
        }
        throw new IllegalArgumentException("unterminated string starting at offset " + start);
    }

    static boolean identifierPart(char c) {
        return Character.isLetterOrDigit(c) || c == '_' || c == '$' || c == '\\' || c > 127;
    }

    private static final class Js {
        private final String s;
        private final int n;
        private final StringBuilder out;
        /** The last token written, or null at the start. */
        private String last;
        private boolean lastIsNumber;

        Js(String source) {
            this.s = source;
            this.n = source.length();
            this.out = new StringBuilder(source.length());
        }

        String run() {
            boolean space = false;
            boolean newline = false;
            int i = 0;
            while (i < n) {
                char c = s.charAt(i);
                char next = i + 1 < n ? s.charAt(i + 1) : 0;
                if (c == '\n' || c == '\r' || c == '\u2028' || c == '\u2029') {
                    newline = true;
                    i++;
                    continue;
                }
                if (Character.isWhitespace(c) || c == '\uFEFF') {
                    space = true;
                    i++;
                    continue;
                }
                if (c == '/' && next == '/') {
                    while (i < n && s.charAt(i) != '\n' && s.charAt(i) != '\r') {
                        i++;
                    }
                    space = true;
                    continue;
                }
                if (c == '/' && next == '*') {
                    int end = s.indexOf("*/", i + 2);
                    if (end < 0) {
                        throw new IllegalArgumentException("unterminated comment starting at offset " + i);
                    }
                    String body = s.substring(i, end);
                    newline |= body.indexOf('\n') >= 0 || body.indexOf('\r') >= 0;
                    space = true;
                    i = end + 2;
                    continue;
                }
                int end;
                boolean number = false;
                if (c == '"' || c == '\'') {
                    end = stringEnd(s, i);
                } else if (c == '`') {
                    end = templateEnd(i);
                } else if (c == '/' && regexAllowed()) {
                    end = regexEnd(i);
                } else if (Character.isDigit(c) || (c == '.' && Character.isDigit(next))) {
                    end = numberEnd(i);
                    number = true;
                } else if (identifierPart(c)) {
                    end = i + 1;
                    while (end < n && identifierPart(s.charAt(end))) {
                        end++;
                    }
                } else {
                    end = i + 1;
                }
                String token = s.substring(i, end);
                separate(token, space, newline);
                out.append(token);
                last = token;
                lastIsNumber = number;
                space = false;
                newline = false;
                i = end;
            }
            return out.toString();
        }

        /** Writes the separator, if any, that the whitespace before {@code token} must leave behind. */
        private void separate(String token, boolean space, boolean newline) {
            if (last == null || !(space || newline)) {
                return;
            }
            char prev = last.charAt(last.length() - 1);
            char first = token.charAt(0);
            if (newline && lineBreakMatters(prev, first)) {
                out.append('\n');
            } else if (needsSpace(prev, first)) {
                out.append(' ');
            }
        }

        /**
         * Whether removing a line break between the two tokens could change the program: a semicolon is inserted
         * at a line break only where the next token cannot continue the statement, or after {@code return},
         * {@code break}, {@code continue}, {@code throw}, {@code yield} and before a postfix {@code ++}/{@code --}.
         * After a token that cannot end a statement, or before one that cannot start one, no semicolon is ever
         * inserted.
         */
        private boolean lineBreakMatters(char prev, char first) {
            boolean prevCannotEnd = "{([,;:=*%&|^!~?<>".indexOf(prev) >= 0
                    || ((prev == '+' || prev == '-') && !(last.length() == 1 && penultimateIs(prev)));
            boolean nextCannotStart = "}),;.:?]=".indexOf(first) >= 0;
            return !(prevCannotEnd || nextCannotStart);
        }

        /** Whether the character written before the last one-character token equals {@code c} (as in ++ or --). */
        private boolean penultimateIs(char c) {
            return out.length() >= 2 && out.charAt(out.length() - 2) == c;
        }

        private boolean needsSpace(char prev, char first) {
            return (identifierPart(prev) && identifierPart(first))
                    || (prev == '+' && first == '+') || (prev == '-' && first == '-')
                    || (prev == '/' && (first == '/' || first == '*'))
                    || (lastIsNumber && first == '.');
        }

        private boolean regexAllowed() {
            if (last == null) {
                return true;
            }
            char prev = last.charAt(last.length() - 1);
            if (identifierPart(prev) || prev == '"' || prev == '\'' || prev == '`') {
                return KEYWORDS_BEFORE_EXPRESSION.contains(last);
            }
            return prev != ')' && prev != ']' && prev != '}';
        }

        private int numberEnd(int start) {
            int i = start;
            boolean hex = s.startsWith("0x", start) || s.startsWith("0X", start);
            while (i < n) {
                char c = s.charAt(i);
                if (identifierPart(c) || c == '.') {
                    i++;
                } else if ((c == '+' || c == '-') && !hex && (s.charAt(i - 1) == 'e' || s.charAt(i - 1) == 'E')) {
                    i++;
                } else {
                    break;
                }
            }
            return i;
        }

        private int regexEnd(int start) {
            int i = start + 1;
            boolean inClass = false;
            while (i < n) {
                char c = s.charAt(i);
                if (c == '\\') {
                    i += 2;
                    continue;
                }
                if (c == '\n') {
                    throw new IllegalArgumentException("unterminated regular expression at offset " + start);
                }
                if (c == '[') {
                    inClass = true;
                } else if (c == ']') {
                    inClass = false;
                } else if (c == '/' && !inClass) {
                    i++;
                    while (i < n && identifierPart(s.charAt(i))) {
                        i++;
                    }
                    return i;
                }
                i++;
            }
            throw new IllegalArgumentException("unterminated regular expression at offset " + start);
        }

        /** Index past the template literal opening at {@code start}, its substitutions included, copied verbatim. */
        private int templateEnd(int start) {
            int i = start + 1;
            while (i < n) {
                char c = s.charAt(i);
                if (c == '\\') {
                    i += 2;
                } else if (c == '`') {
                    return i + 1;
                } else if (c == '$' && i + 1 < n && s.charAt(i + 1) == '{') {
                    i = substitutionEnd(i + 2);
                } else {
                    i++;
                }
            }
            throw new IllegalArgumentException("unterminated template literal at offset " + start);
        }

        /** Index past the closing brace of a substitution whose code starts at {@code start}. */
        private int substitutionEnd(int start) {
            int depth = 0;
            int i = start;
            while (i < n) {
                char c = s.charAt(i);
                if (c == '"' || c == '\'') {
                    i = stringEnd(s, i);
                } else if (c == '`') {
                    i = templateEnd(i);
                } else if (c == '{') {
                    depth++;
                    i++;
                } else if (c == '}') {
                    if (depth == 0) {
                        return i + 1;
                    }
                    depth--;
                    i++;
                } else {
                    i++;
                }
            }
            throw new IllegalArgumentException("unterminated template substitution at offset " + start);
        }
    }
}
