using HandLine.Model;
using HandLine.Synthesis;

namespace HandLine.Tests.Synthesis;

public sealed class WordListTests : IDisposable
{
    private readonly string _dir = SynthesisFixtures.NewTempDir();

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [Fact]
    public void Keeps_words_in_the_character_set_once_in_file_order_and_drops_possessives()
    {
        // "café" (é), "naïve" (ï) and "Zürich" are outside the default set; "stall's" is a possessive;
        // "  bramble \r" has spaces and a Windows line end; "bramble" and "quire" appear twice.
        var path = Path.Combine(_dir, "w.txt");
        File.WriteAllText(path, "quire\ncafé\nstall's\n  bramble \r\nnaïve\nZürich\nquire\no'clock\nbramble\n\nwell-kept\n");

        var words = WordList.Load(path, CharacterSet.Default);

        Assert.Equal(["quire", "bramble", "o'clock", "well-kept"], words);
    }

    [Fact]
    public void Missing_unreadable_invalid_or_empty_lists_name_the_file()
    {
        var missing = Path.Combine(_dir, "none.txt");
        var e = Assert.Throws<InputException>(() => WordList.Load(missing, CharacterSet.Default));
        Assert.Equal(missing, e.Path);
        Assert.Contains(missing, e.Message, StringComparison.Ordinal);

        // A folder in place of a file.
        e = Assert.Throws<InputException>(() => WordList.Load(_dir, CharacterSet.Default));
        Assert.Equal(_dir, e.Path);

        var latin1 = Path.Combine(_dir, "latin1.txt");
        File.WriteAllBytes(latin1, [(byte)'c', (byte)'a', (byte)'f', 0xE9, (byte)'\n']); // "café" in ISO-8859-1
        e = Assert.Throws<InputException>(() => WordList.Load(latin1, CharacterSet.Default));
        Assert.Equal(latin1, e.Path);
        Assert.Contains("UTF-8", e.Reason, StringComparison.Ordinal);

        var foreign = Path.Combine(_dir, "foreign.txt");
        File.WriteAllText(foreign, "漢字\ncafé\nwalk's\n");
        e = Assert.Throws<InputException>(() => WordList.Load(foreign, CharacterSet.Default));
        Assert.Equal(foreign, e.Path);

        var big = TestWords.Write(_dir);
        e = Assert.Throws<InputException>(() => WordList.Load(big, CharacterSet.Default, new TextMixtureOptions { MaxWordListBytes = 100 }));
        Assert.Contains("limit", e.Reason, StringComparison.Ordinal);
    }
}
