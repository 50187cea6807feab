using System.Text.Json;
using HandLine.Calibration;

namespace HandLine.Tests.Calibration;

public sealed class CalibrationTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-cal-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    /// <summary>Writes a truth manifest and a run's lines.jsonl: one line per source, every character at one confidence.</summary>
    private (string Truth, string Run) Write(IEnumerable<(string Truth, string Hyp, double CharConf, double LineConf)> lines)
    {
        var run = Path.Combine(_dir, "run");
        Directory.CreateDirectory(run);
        var truth = new List<string>();
        var records = new List<string>();
        var n = 0;
        foreach (var (t, h, cc, lc) in lines)
        {
            var source = $"ledger-{n++:D4}.png";
            truth.Add($"{source}\t{t}");
            records.Add(JsonSerializer.Serialize(new Dictionary<string, object>
            {
                ["source"] = source, ["line"] = 0, ["text"] = h, ["confidence"] = lc,
                ["chars"] = h.Select(c => new Dictionary<string, object> { ["char"] = c.ToString(), ["confidence"] = cc }).ToArray(),
            }));
        }
        File.WriteAllLines(Path.Combine(_dir, "truth.tsv"), truth);
        File.WriteAllLines(Path.Combine(run, "lines.jsonl"), records);
        return (Path.Combine(_dir, "truth.tsv"), run);
    }

    /// <summary>
    /// Hand computation with ECE = Σ_m |B_m|/n · |acc(B_m) − conf(B_m)| (Guo et al. 2017, eq. 3), 10 bins ((m−1)/10, m/10].
    /// Lines (truth / hypothesis, character confidence, line confidence):
    ///   abcdefghij / abcdefghij 0.95, 0.9 — 10 right, 0 errors
    ///   abcdefghij / abXdefghij 0.95, 0.6 — 9 of 10 right, 1 error
    ///   abcde / aXXde           0.75, 0.2 — 3 of 5 right, 2 errors
    ///   abcde / abcde           0.75, 0.4 — 5 of 5 right, 0 errors
    ///   abcdefgh / abcd         0.95, 0.5 — 4 of 4 right, 4 deletions
    /// Bin (0.9, 1]: 24 characters, 23 right: |23/24 − 0.95| = 1/120. Bin (0.7, 0.8]: 10 characters, 8 right: |0.8 − 0.75| = 0.05.
    /// ECE = (24/34)(1/120) + (10/34)(0.05) = 0.7/34.
    /// Lines: exactly right at 0.9 and 0.4, wrong at 0.6, 0.2, 0.5 — each alone in its bin:
    /// ECE = (0.1 + 0.6 + 0.2 + 0.6 + 0.5)/5 = 0.4.
    /// Threshold, 7 errors: by rising line confidence 0.2 (2), 0.4 (0), 0.5 (4), 0.6 (1), 0.9 (0).
    /// Catch 90% needs 6.3 → first four lines (7 errors), threshold halfway between 0.6 and 0.9 = 0.75.
    /// Catch 80% needs 5.6 → first three lines (6 errors), threshold halfway between 0.5 and 0.6 = 0.55.
    /// </summary>
    [Fact]
    public void EceAndThresholdMatchTheHandComputation()
    {
        var (truth, run) = Write(
        [
            ("abcdefghij", "abcdefghij", 0.95, 0.9),
            ("abcdefghij", "abXdefghij", 0.95, 0.6),
            ("abcde", "aXXde", 0.75, 0.2),
            ("abcde", "abcde", 0.75, 0.4),
            ("abcdefgh", "abcd", 0.95, 0.5),
        ]);
        var input = CalibrationInput.Load(truth, run);
        var report = Calibrator.Evaluate(input.Lines, 0.9, 10);

        Assert.Equal(34, report.Characters.Count);
        Assert.Equal(0.7 / 34, report.Characters.Ece, 12);
        Assert.Equal(24, report.Characters.Bins[9].Count);
        Assert.Equal(23.0 / 24, report.Characters.Bins[9].Accuracy, 12);
        Assert.Equal(10, report.Characters.Bins[7].Count);
        Assert.Equal(0.4, report.Lines.Ece, 12);

        Assert.Equal(0.75, report.Threshold.FlagBelow, 12);
        Assert.Equal((4, 7, 7), (report.Threshold.FlaggedLines, report.Threshold.CaughtErrors, report.Threshold.TotalErrors));
        var eighty = Calibrator.ChooseThreshold(input.Lines, 0.8);
        Assert.Equal(0.55, eighty.FlagBelow, 12);
        Assert.Equal((3, 6), (eighty.FlaggedLines, eighty.CaughtErrors));
    }

    /// <summary>
    /// Known error model: 1000 characters at each confidence c in {0.55, 0.65, ..., 0.95}, of which exactly
    /// round(c·1000) are right. Calibrated confidences have ECE 0 (Guo et al. 2017: acc = conf in every bin);
    /// reporting 0.95 for every character instead makes ECE = |mean accuracy − 0.95| = |0.75 − 0.95| = 0.2.
    /// </summary>
    [Theory]
    [InlineData(false, 0.0)]
    [InlineData(true, 0.2)]
    public void AKnownErrorModelGivesItsEce(bool overconfident, double expected)
    {
        const string truthText = "abcdefghij"; // distinct letters: a substitution by 'X' can only align one way
        var lines = new List<(string, string, double, double)>();
        foreach (var conf in new[] { 0.55, 0.65, 0.75, 0.85, 0.95 })
        {
            var wrong = 1000 - (int)Math.Round(conf * 1000);
            for (var n = 0; n < 100; n++)
            {
                // Spread the wrong characters evenly over the 100 lines of this group.
                var wrongHere = wrong / 100 + (n < wrong % 100 ? 1 : 0);
                var hyp = truthText.ToCharArray();
                for (var k = 0; k < wrongHere; k++) hyp[k * 2 % 10 + k * 2 / 10] = 'X';
                lines.Add((truthText, new string(hyp), overconfident ? 0.95 : conf, 0.5));
            }
        }
        var (truth, run) = Write(lines);
        var report = Calibrator.Evaluate(CalibrationInput.Load(truth, run).Lines, 0.9, 10);
        Assert.Equal(5000, report.Characters.Count);
        Assert.Equal(expected, report.Characters.Ece, 9);
    }

    [Fact]
    public void NoErrorsMeansNothingToFlag()
    {
        var (truth, run) = Write([("hay", "hay", 0.9, 0.9)]);
        var t = Calibrator.Evaluate(CalibrationInput.Load(truth, run).Lines).Threshold;
        Assert.Equal((0.0, 0, 0), (t.FlagBelow, t.FlaggedLines, t.TotalErrors));
    }
}
