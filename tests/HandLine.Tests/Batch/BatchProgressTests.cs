using HandLine.Batch;

namespace HandLine.Tests.Batch;

public sealed class BatchProgressTests
{
    /// <summary>A clock the test moves by hand.</summary>
    private sealed class ManualClock : TimeProvider
    {
        private long _ticks;
        public void Advance(TimeSpan by) => _ticks += by.Ticks;
        public override long GetTimestamp() => _ticks;
        public override long TimestampFrequency => TimeSpan.TicksPerSecond;
    }

    private static readonly BatchOptions Options = new() { PlainInterval = TimeSpan.FromSeconds(10), TerminalInterval = TimeSpan.FromMilliseconds(250) };

    [Fact]
    public void PlainProgressWritesAStatusLineEachIntervalAndEveryError()
    {
        var clock = new ManualClock();
        var log = new StringWriter();
        var p = new BatchProgress(log, ProgressStyle.Plain, Options, clock);
        p.Start(total: 10, inputErrors: [new InputException("/scans/register.tsv", "manifest", "line 3: no tab between path and transcript")]);
        const string Told = "error: /scans/register.tsv: line 3: no tab between path and transcript\n"; // a bad input is told at once
        for (var i = 0; i < 4; i++) { clock.Advance(TimeSpan.FromSeconds(2)); p.Read(lines: 2); }
        Assert.Equal(Told, log.ToString().Replace("\r\n", "\n")); // 8 s: no status line yet

        clock.Advance(TimeSpan.FromSeconds(2));
        p.Read(lines: 2); // 10 s: 5 images read, 10 lines, 1 line/s; 5 left at 2 s each
        Assert.Equal(Told + "5/10 images, 10 lines, 1.0 lines/s, 0:10 left, 1 error\n", log.ToString().Replace("\r\n", "\n"));

        p.Failed(new InputException("/scans/folio-6.png", "decode", "the file is cut short"));
        Assert.EndsWith("error: /scans/folio-6.png: the file is cut short\n", log.ToString().Replace("\r\n", "\n"));
        Assert.Contains("2 errors", p.Status());
    }

    [Fact]
    public void ReusedImagesCountAsDoneButNotTowardsTheRate()
    {
        var clock = new ManualClock();
        var p = new BatchProgress(null, ProgressStyle.Plain, Options, clock);
        p.Start(total: 4, inputErrors: []);
        p.Reused(lines: 3);
        p.Reused(lines: 3);
        Assert.StartsWith("2/4 images, 6 lines, 0.0 lines/s, time left unknown", p.Status());
        clock.Advance(TimeSpan.FromSeconds(4));
        p.Read(lines: 1);
        Assert.Equal("3/4 images, 7 lines, 0.2 lines/s, 0:04 left, 0 errors", p.Status());
    }

    [Fact]
    public void TerminalProgressRedrawsOneLineInPlace()
    {
        var clock = new ManualClock();
        var screen = new StringWriter();
        var p = new BatchProgress(screen, ProgressStyle.Terminal, Options, clock);
        p.Start(total: 3, inputErrors: []);
        clock.Advance(TimeSpan.FromSeconds(1));
        p.Read(lines: 1);
        clock.Advance(TimeSpan.FromSeconds(1));
        p.Read(lines: 1);
        p.Finish();
        var text = screen.ToString();
        Assert.StartsWith("\r0/3 images", text);
        Assert.Contains("\r1/3 images", text);
        Assert.Contains("\r2/3 images", text);
        Assert.EndsWith(Environment.NewLine, text);
        Assert.Single(text.Split(Environment.NewLine), l => l.Length > 0); // one line, redrawn
    }

    [Fact]
    public void NoneWritesNothing()
    {
        var log = new StringWriter();
        var p = new BatchProgress(log, ProgressStyle.None, Options, new ManualClock());
        p.Start(2, []);
        p.Failed(new InputException("a.png", "decode", "the file is empty"));
        p.Read(1);
        p.Finish();
        Assert.Equal("", log.ToString());
    }
}
