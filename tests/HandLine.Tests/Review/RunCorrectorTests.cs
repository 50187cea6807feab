using System.Text.Json.Nodes;
using HandLine.Review;

namespace HandLine.Tests.Review;

public sealed class RunCorrectorTests : IDisposable
{
    private readonly ReviewRunFixture _run = new();

    public void Dispose() => _run.Dispose();

    private string Corrections(params Correction[] corrections)
    {
        var path = _run.File_("corrections.tsv");
        File.WriteAllText(path, CorrectionsFile.Write(corrections));
        return path;
    }

    private static Correction Fix(int line, string text, bool illegible = false) =>
        new(ReviewRunFixture.Lines[line].Source, 0, text, ReviewRunFixture.Lines[line].Text, illegible);

    private JsonObject Record(string source) =>
        File.ReadAllLines(Path.Combine(_run.Run, "lines.jsonl")).Select(l => (JsonObject)JsonNode.Parse(l)!)
            .Single(r => (string)r["source"]! == source);

    [Fact]
    public void A_correction_replaces_the_text_keeps_the_machine_text_and_feeds_the_truth_manifest()
    {
        var file = Corrections(Fix(0, "Paid to Wm Oakes for barley"), Fix(1, "Rent <and> tithe"), Fix(2, "Baptised Ann", illegible: true));

        var result = RunCorrector.Apply(_run.Run, file, _run.Images);

        Assert.Equal(3, result.LinesChanged);
        var first = Record("ledger/002.png");
        Assert.Equal("Paid to Wm Oakes for barley", (string)first["text"]!);
        Assert.Equal("Paid to Wm Okes for barley", (string)first["machine_text"]!);
        Assert.True((bool)first["corrected"]!);
        Assert.Equal(0.31, (double)first["confidence"]!);
        Assert.NotNull(first["chars"]);
        Assert.True((bool)Record("register/014.png")["illegible"]!);
        Assert.Null(Record("register/015.png")["corrected"]);
        Assert.Equal("Paid to Wm Oakes for barley\n", File.ReadAllText(Path.Combine(_run.Run, "ledger/002.txt")));
        Assert.Contains(",Rent <and> tithe,", File.ReadAllText(Path.Combine(_run.Run, "lines.csv")));
        Assert.Contains("ledger/002.png,0,Paid to Wm Oakes for barley,0.31,true,0.5,-1.25\n", File.ReadAllText(Path.Combine(_run.Run, "lines.csv")));

        // The manifest holds the two legible corrections with their crops, readable as a training set.
        var manifest = HandLine.Formats.Manifest.Read(result.ManifestPath);
        Assert.Equal(2, result.ManifestLines);
        Assert.Equal(1, result.Illegible);
        Assert.Equal(["Paid to Wm Oakes for barley", "Rent <and> tithe"], manifest.Entries.Select(e => e.Text).Order(StringComparer.Ordinal));
        Assert.All(manifest.Entries, e => Assert.True(File.Exists(e.FullPath), e.FullPath));
    }

    [Fact]
    public void Applying_the_same_file_twice_changes_nothing()
    {
        var file = Corrections(Fix(0, "Paid to Wm Oakes for barley"), Fix(1, "Rent and tithe"));
        RunCorrector.Apply(_run.Run, file, _run.Images);
        var once = _run.Snapshot();

        var again = RunCorrector.Apply(_run.Run, file, _run.Images);

        Assert.Equal(0, again.LinesChanged);
        Assert.Equal(0, again.TranscriptsWritten);
        var twice = _run.Snapshot();
        Assert.Equal(once.Keys.Order(), twice.Keys.Order());
        Assert.All(once, f => Assert.True(f.Value.AsSpan().SequenceEqual(twice[f.Key]), f.Key));
    }

    [Fact]
    public void A_second_correction_of_a_line_keeps_the_first_machine_text()
    {
        RunCorrector.Apply(_run.Run, Corrections(Fix(0, "Paid to Wm Oakes for barley")), _run.Images);
        RunCorrector.Apply(_run.Run, Corrections(Fix(0, "Paid to Wm. Oakes for barley")), _run.Images);

        var record = Record("ledger/002.png");
        Assert.Equal("Paid to Wm. Oakes for barley", (string)record["text"]!);
        Assert.Equal("Paid to Wm Okes for barley", (string)record["machine_text"]!);
    }

    [Fact]
    public void A_line_that_is_not_in_the_run_is_named_and_nothing_is_changed()
    {
        var before = _run.Snapshot();
        var file = Corrections(Fix(0, "Paid to Wm Oakes for barley"), new Correction("ledger/999.png", 0, "Sold two ewes", "Sold tvo ewes", false),
            new Correction("ledger/002.png", 4, "x", "y", false));

        var e = Assert.Throws<InputException>(() => RunCorrector.Apply(_run.Run, file, _run.Images));

        Assert.Contains("'ledger/999.png' line 0 is not in the run", e.Reason);
        Assert.Contains("'ledger/002.png' line 4 is not in the run", e.Reason);
        Assert.Equal(file, e.Path);
        var after = _run.Snapshot();
        Assert.Equal(before.Keys.Order(), after.Keys.Order());
        Assert.All(before, f => Assert.True(f.Value.AsSpan().SequenceEqual(after[f.Key]), f.Key));
    }

    [Fact]
    public void Corrections_made_on_another_run_are_refused()
    {
        var before = _run.Snapshot();
        var file = Corrections(new Correction("ledger/002.png", 0, "Paid to Wm Oakes for barley", "Paid to Wm Oakes for barely", false));

        var e = Assert.Throws<InputException>(() => RunCorrector.Apply(_run.Run, file, _run.Images));

        Assert.Contains("not the run's", e.Reason);
        Assert.Equal(before.Count, _run.Snapshot().Count);
    }

    [Fact]
    public void The_corrections_file_round_trips_hostile_fields_and_rejects_malformed_rows()
    {
        var hostile = new Correction("a\tb\\c\nd.png", 2, "x\\ty", "m", true);
        var path = _run.File_("c.tsv");
        File.WriteAllText(path, CorrectionsFile.Write([hostile]));
        Assert.Equal([hostile], CorrectionsFile.Read(path));

        File.WriteAllText(path, "source\tline\ttext\tmachine\tillegible\nx.png\t0\tbad \\q escape\tm\tfalse\n");
        Assert.Contains("line 2: unknown escape", Assert.Throws<InputException>(() => CorrectionsFile.Read(path)).Reason);
        File.WriteAllText(path, "x.png\t0\ttext\tm\tfalse\n");
        Assert.Contains("header", Assert.Throws<InputException>(() => CorrectionsFile.Read(path)).Reason);
        File.WriteAllText(path, "source\tline\ttext\tmachine\tillegible\nx.png\t0\ta\\nb\tm\tfalse\n");
        Assert.Contains("line break", Assert.Throws<InputException>(() => CorrectionsFile.Read(path)).Reason);
        File.WriteAllText(path, "source\tline\ttext\tmachine\tillegible\nx.png\t0\ta\tm\tfalse\nx.png\t0\tb\tm\tfalse\n");
        Assert.Contains("corrected twice", Assert.Throws<InputException>(() => CorrectionsFile.Read(path)).Reason);
    }
}
