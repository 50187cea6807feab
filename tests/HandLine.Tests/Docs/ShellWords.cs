using System.Text;

namespace HandLine.Tests.Docs;

/// <summary>A word of a shell line, or an operator (&amp;&amp;, |, ;, &gt; ...) that ends a command.</summary>
internal sealed record ShellWord(string Text, bool IsOperator, bool WasQuoted);

/// <summary>
/// Splits a documented command line into words the way a POSIX shell would for the simple lines docs hold:
/// quotes, backslash escapes, comments and the operators that end a command. No expansion: $VAR stays as
/// written, which is fine for checking that commands and options exist.
/// </summary>
internal static class ShellWords
{
    public static IReadOnlyList<ShellWord> Split(string line)
    {
        ArgumentNullException.ThrowIfNull(line);
        var words = new List<ShellWord>();
        var word = new StringBuilder();
        var inWord = false;
        var quoted = false;
        void Flush()
        {
            if (inWord) words.Add(new ShellWord(word.ToString(), false, quoted));
            word.Clear();
            inWord = false;
            quoted = false;
        }
        for (var i = 0; i < line.Length; i++)
        {
            var c = line[i];
            if (char.IsWhiteSpace(c)) { Flush(); continue; }
            if (c == '#' && !inWord) break;
            if (c == '\'')
            {
                var end = line.IndexOf('\'', i + 1);
                if (end < 0) end = line.Length;
                word.Append(line, i + 1, end - i - 1);
                inWord = quoted = true;
                i = end;
                continue;
            }
            if (c == '"')
            {
                inWord = quoted = true;
                for (i++; i < line.Length && line[i] != '"'; i++)
                {
                    if (line[i] == '\\' && i + 1 < line.Length && line[i + 1] is '"' or '\\' or '$' or '`') i++;
                    word.Append(line[i]);
                }
                continue;
            }
            if (c == '\\' && i + 1 < line.Length) { word.Append(line[++i]); inWord = true; continue; }
            if (c is '&' or '|' or ';' or '<' or '>' or '(' or ')')
            {
                Flush();
                var op = i + 1 < line.Length && line[i + 1] == c && c is '&' or '|' or '>' or '<' ? line.Substring(i++, 2) : c.ToString();
                words.Add(new ShellWord(op, true, false));
                continue;
            }
            word.Append(c);
            inWord = true;
        }
        Flush();
        return words;
    }
}
