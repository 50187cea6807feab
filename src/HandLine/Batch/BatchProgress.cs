using System.Globalization;

namespace HandLine.Batch;

/// <summary>
/// Progress of a batch on a writer (stderr): images done of the total, lines, lines per second, time left and
/// errors so far. At a terminal the status line is redrawn in place; otherwise a plain line is written now and
/// then, so logs stay readable. Rate and time left count only images read in this run, not reused ones.
/// </summary>
internal sealed class BatchProgress
{
    private readonly TextWriter? _writer;
    private readonly ProgressStyle _style;
    private readonly TimeSpan _interval;
    private readonly TimeProvider _time;
    private long _started, _lastShown;
    private int _total, _done, _fresh, _errors, _lines, _freshLines, _shownLength;

    public BatchProgress(TextWriter? writer, ProgressStyle style, BatchOptions options, TimeProvider? time = null)
    {
        ArgumentNullException.ThrowIfNull(options);
        _writer = style == ProgressStyle.None ? null : writer;
        _style = style;
        _interval = style == ProgressStyle.Terminal ? options.TerminalInterval : options.PlainInterval;
        _time = time ?? TimeProvider.System;
    }

    /// <param name="inputErrors">Inputs found bad before any image is read (a manifest line, a missing file):
    /// each is told now, the same way as an image that fails later.</param>
    public void Start(int total, IReadOnlyList<InputException> inputErrors)
    {
        ArgumentNullException.ThrowIfNull(inputErrors);
        _total = total;
        _errors = inputErrors.Count;
        _started = _lastShown = _time.GetTimestamp();
        foreach (var e in inputErrors) _writer?.WriteLine(ErrorLine(e));
        if (_style == ProgressStyle.Terminal) Show();
    }

    public void Reused(int lines)
    {
        _done++;
        _lines += lines;
        Tick();
    }

    public void Read(int lines)
    {
        _done++;
        _fresh++;
        _lines += lines;
        _freshLines += lines;
        Tick();
    }

    public void Failed(InputException e)
    {
        _done++;
        _errors++;
        if (_writer is null) return;
        if (_style == ProgressStyle.Terminal) ClearLine();
        _writer.WriteLine(ErrorLine(e));
        if (_style == ProgressStyle.Terminal) Show();
        Tick();
    }

    private static string ErrorLine(InputException e) => $"error: {e.Message}";

    /// <summary>Ends the status line at a terminal; a plain log gets the caller's closing summary instead.</summary>
    public void Finish()
    {
        if (_writer is null || _style != ProgressStyle.Terminal) return;
        Show();
        _writer.WriteLine();
        _shownLength = 0;
    }

    /// <summary>The status text, e.g. "12/40 images, 12 lines, 3.1 lines/s, 0:09 left, 1 error".</summary>
    public string Status()
    {
        var seconds = _time.GetElapsedTime(_started).TotalSeconds;
        var rate = seconds > 0 ? _freshLines / seconds : 0;
        string left;
        if (_done >= _total) left = "0:00 left";
        else if (_fresh == 0 || seconds <= 0) left = "time left unknown";
        else left = Clock(seconds / _fresh * (_total - _done)) + " left";
        return string.Create(CultureInfo.InvariantCulture,
            $"{_done}/{_total} images, {_lines} lines, {rate:F1} lines/s, {left}, {_errors} error{(_errors == 1 ? "" : "s")}");
    }

    private void Tick()
    {
        if (_writer is null) return;
        var now = _time.GetTimestamp();
        if (_time.GetElapsedTime(_lastShown, now) < _interval) return;
        _lastShown = now;
        Show();
    }

    private void Show()
    {
        if (_writer is null) return;
        var text = Status();
        if (_style == ProgressStyle.Terminal)
        {
            // Pad with spaces so a shorter status fully covers the longer one before it.
            _writer.Write("\r" + text.PadRight(_shownLength));
            _shownLength = text.Length;
        }
        else
        {
            _writer.WriteLine(text);
        }
        _writer.Flush();
    }

    private void ClearLine()
    {
        if (_shownLength == 0) return;
        _writer!.Write("\r" + new string(' ', _shownLength) + "\r");
        _shownLength = 0;
    }

    private static string Clock(double seconds)
    {
        var t = TimeSpan.FromSeconds(Math.Min(seconds, TimeSpan.FromDays(99).TotalSeconds));
        return t.TotalHours >= 1
            ? string.Create(CultureInfo.InvariantCulture, $"{(int)t.TotalHours}:{t.Minutes:00}:{t.Seconds:00}")
            : string.Create(CultureInfo.InvariantCulture, $"{t.Minutes}:{t.Seconds:00}");
    }
}
