using HandLine.Language;

namespace HandLine.Tests.Language;

public sealed class LexiconFileTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-words-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private string Write(string name, byte[] bytes)
    {
        var path = Path.Combine(_dir, name);
        File.WriteAllBytes(path, bytes);
        return path;
    }

    [Fact]
    public void WordsCountsCommentsAndCaseVariantsAreRead()
    {
        var path = Write("ok.txt", "\uFEFF# Merrowby Hall words\r\nbarley\t12\r\nRecd\n\nbarley\t3\nbush\n"u8.ToArray());
        var lexicon = Lexicon.Load(path);
        Assert.Equal(15, lexicon.Counts["barley"]);
        Assert.Equal(1, lexicon.Counts["Recd"]);
        Assert.Equal(2, lexicon.LineOf("barley"));
        Assert.True(lexicon.Accepts("BARLEY"));
        Assert.True(lexicon.Accepts("Bush"));
        Assert.True(lexicon.Accepts("RECD"));
        Assert.False(lexicon.Accepts("recd")); // lower-casing a listed capital is not one of the variants
    }

    [Theory]
    [InlineData("barley\nbush.\n", 2, "not a letter")]
    [InlineData("barley\t1\t2\n", 1, "more than one tab")]
    [InlineData("hay\nbarley\tmany\n", 2, "not a whole number")]
    [InlineData("hay\nbarley\t-3\n", 2, "not a whole number")]
    [InlineData("two words\n", 1, "space")]
    [InlineData("hay\n\t4\n", 2, "empty")]
    public void ABadLineIsNamedWithItsFileAndNumber(string text, int line, string reason)
    {
        var path = Write("bad.txt", System.Text.Encoding.UTF8.GetBytes(text));
        var e = Assert.Throws<InputException>(() => Lexicon.Load(path));
        Assert.Equal(path, e.Path);
        Assert.Contains($"line {line}:", e.Message);
        Assert.Contains(reason, e.Message);
    }

    [Fact]
    public void InvalidUtf8AndEmptyListsAreRejected()
    {
        var e = Assert.Throws<InputException>(() => Lexicon.Load(Write("latin1.txt", [(byte)'h', (byte)'a', (byte)'y', 10, 0xE9, 10])));
        Assert.Contains("line 2: not valid UTF-8", e.Message);
        Assert.Contains("no words", Assert.Throws<InputException>(() => Lexicon.Load(Write("empty.txt", "# none\n"u8.ToArray()))).Message);
        Assert.Throws<InputException>(() => Lexicon.Load(Path.Combine(_dir, "missing.txt")));
    }

    [Fact]
    public void WordsAreRunsOfLetters()
    {
        Assert.Equal(["Recd", "bush", "barley", "s", "d"], Lexicon.WordsIn("Recd 3 bush. barley £1 4s 6d"));
    }
}
