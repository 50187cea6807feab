using HandLine.Formats;

namespace HandLine.Tests.Formats;

public sealed class BoxFileTests
{
    private static string Write(string text)
    {
        var path = Path.Combine(Path.GetTempPath(), "handline-boxes-" + Guid.NewGuid().ToString("N")[..8] + ".tsv");
        File.WriteAllText(path, text);
        return path;
    }

    [Fact]
    public void BoxesAreReadInOrderSkippingCommentsAndBlankLines()
    {
        var path = Write("# page-0001.png\n12\t30\t400\t42\r\n\n# a comment\n12\t80\t90\t40\n");
        try
        {
            Assert.Equal([new LineBox(12, 30, 400, 42), new LineBox(12, 80, 90, 40)], BoxFile.Read(path));
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Theory]
    [InlineData("12\t30\t400\n", "line 1: expected 4 tab-separated fields")]
    [InlineData("# ok\n12\t30\t400\t42\n12\t30\tforty\t42\n", "line 3: field 3 ('forty') is not a whole number")]
    [InlineData("12 30 400 42\n", "line 1: expected 4 tab-separated fields")]
    [InlineData("\n\n12\t30\t0\t42\n", "line 3: width and height must be at least 1")]
    public void AWrongLineNamesTheFileAndTheLine(string text, string reason)
    {
        var path = Write(text);
        try
        {
            var e = Assert.Throws<InputException>(() => BoxFile.Read(path));
            Assert.Equal(path, e.Path);
            Assert.Equal("boxes", e.Stage);
            Assert.StartsWith(reason, e.Reason, StringComparison.Ordinal);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void WrittenBoxesReadBack()
    {
        var path = Path.Combine(Path.GetTempPath(), "handline-boxes-" + Guid.NewGuid().ToString("N")[..8] + ".tsv");
        try
        {
            LineBox[] boxes = [new(1, 2, 3, 4), new(100, 200, 300, 40)];
            BoxFile.Write(path, boxes, "two boxes");
            Assert.Equal(boxes, BoxFile.Read(path));
            Assert.StartsWith("# two boxes\n", File.ReadAllText(path), StringComparison.Ordinal);
        }
        finally
        {
            File.Delete(path);
        }
    }

    [Fact]
    public void IoUIsTheSharedAreaOverTheAreaOfEither()
    {
        // Worked by hand: boxes of 10x10 overlapping in a 5x10 strip share 50 of 150 pixels.
        Assert.Equal(50.0 / 150, new LineBox(0, 0, 10, 10).IoU(new LineBox(5, 0, 10, 10)), 9);
        Assert.Equal(0, new LineBox(0, 0, 10, 10).IoU(new LineBox(10, 0, 10, 10)));
        Assert.Equal(1, new LineBox(3, 4, 5, 6).IoU(new LineBox(3, 4, 5, 6)));
    }
}
