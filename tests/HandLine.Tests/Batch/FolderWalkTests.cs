using HandLine.Batch;

namespace HandLine.Tests.Batch;

/// <summary>Folder inputs with links: every real image once, each link that would read a folder again reported once.</summary>
[System.Runtime.Versioning.UnsupportedOSPlatform("windows")] // symbolic links as on Linux, the supported system
public sealed class FolderWalkTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-walk-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private string Image(string relative)
    {
        var path = Path.Combine(_dir, relative);
        Directory.CreateDirectory(Path.GetDirectoryName(path)!);
        File.WriteAllBytes(path, [1, 2, 3]); // the walk never opens an image
        return path;
    }

    private string Link(string relative, string target)
    {
        var path = Path.Combine(_dir, relative);
        Directory.CreateSymbolicLink(path, target);
        return path;
    }

    [Fact]
    public void ALinkBackToAParentIsReportedOnceAndEveryImageIsReadOnce()
    {
        Image("scans/a.png");
        Image("scans/b.png");
        Image("scans/vol-2/c.png");
        var loop = Link("scans/vol-2/loop", "..");

        var (sources, errors) = InputSet.Expand([Path.Combine(_dir, "scans")]);

        Assert.Equal(["a.png", "b.png", "vol-2/c.png"], sources.Select(s => s.Source));
        var error = Assert.Single(errors);
        Assert.Equal((loop, "read"), (error.Path, error.Stage));
        Assert.Contains("link 'loop'", error.Reason);
        Assert.Contains($"'{Path.Combine(_dir, "scans")}'", error.Reason);
        Assert.Contains("leads back into a folder already read", error.Reason);
    }

    [Fact]
    public void ATranscriptionOfAFolderWithACycleReadsEachImageOnceAndReportsTheCycleOnce()
    {
        var scans = BatchTestSupport.DemoCopies(_dir, 4);
        var loop = Link("scans/merrowby-ledger/loop", "..");
        var outDir = Path.Combine(_dir, "out");

        var summary = TranscribeRun.Run([scans], new TranscribeOptions(outDir, BatchTestSupport.SmallModel(_dir)),
            new BatchOptions { Progress = ProgressStyle.None }, null, default);

        Assert.Equal((4, 1), (summary.Sources, summary.Errors));
        var sources = File.ReadAllLines(Path.Combine(outDir, "lines.jsonl"))
            .Select(l => System.Text.Json.JsonDocument.Parse(l).RootElement.GetProperty("source").GetString()).Distinct();
        Assert.Equal(4, sources.Count());
        var error = System.Text.Json.JsonDocument.Parse(File.ReadAllLines(Path.Combine(outDir, "errors.jsonl")).Single()).RootElement;
        Assert.Equal(loop, error.GetProperty("path").GetString());
        Assert.Contains("leads back into a folder already read", error.GetProperty("reason").GetString());
    }

    [Fact]
    public void ALinkToTheFolderThatHoldsTheInputIsNotFollowed()
    {
        Image("scans/a.png");
        Image("beside.png"); // in the parent: reading it through the link would read the input folder again too
        var up = Link("scans/up", "..");
        var self = Link("scans/here", ".");

        var (sources, errors) = InputSet.Expand([Path.Combine(_dir, "scans")]);

        Assert.Equal(["a.png"], sources.Select(s => s.Source));
        Assert.Equal([self, up], errors.Select(e => e.Path));
        Assert.All(errors, e => Assert.Contains("already read", e.Reason));
    }

    [Fact]
    public void LinksToAFolderOutsideAndToAFileAreFollowedAndASecondLinkToTheSameFolderIsNot()
    {
        Image("scans/a.png");
        var outside = Image("elsewhere/d.png");
        Image("elsewhere/deeper/e.png");
        Link("scans/ext", Path.Combine(_dir, "elsewhere"));
        var again = Link("scans/ext-again", "../elsewhere/deeper");
        File.CreateSymbolicLink(Path.Combine(_dir, "scans", "f.png"), outside);

        var (sources, errors) = InputSet.Expand([Path.Combine(_dir, "scans")]);

        Assert.Equal(["a.png", "ext/d.png", "ext/deeper/e.png", "f.png"], sources.Select(s => s.Source));
        Assert.Equal(Path.Combine(_dir, "scans", "ext", "d.png"), sources[1].FullPath);
        Assert.Equal(again, Assert.Single(errors).Path);
    }

    [Fact]
    public void AFolderIsReadUnderItsOwnNameRatherThanThroughALinkThatSortsBeforeIt()
    {
        Image("scans/vol-2/c.png");
        var shortcut = Link("scans/a-shortcut", "vol-2");

        var (sources, errors) = InputSet.Expand([Path.Combine(_dir, "scans")]);

        Assert.Equal(["vol-2/c.png"], sources.Select(s => s.Source));
        Assert.Equal(shortcut, Assert.Single(errors).Path);
    }

    [Fact]
    public void AnInputFolderGivenThroughALinkIsReadAndALoopOfLinksIsReported()
    {
        Image("scans/a.png");
        var viaLink = Link("scans-link", "scans");
        var spin = Link("scans/spin", "spin");

        var (sources, errors) = InputSet.Expand([viaLink]);

        Assert.Equal(["a.png"], sources.Select(s => s.Source));
        Assert.Equal(Path.Combine(viaLink, "a.png"), sources[0].FullPath);
        var error = Assert.Single(errors);
        Assert.Equal(Path.Combine(viaLink, "spin"), error.Path);
        Assert.Contains("loop of links", error.Reason);
    }
}
