namespace HandLine.Batch;

/// <summary>How a batch reports progress on its progress writer (normally stderr).</summary>
public enum ProgressStyle
{
    /// <summary>Nothing: not even per-input error lines (they are in errors.jsonl).</summary>
    None,

    /// <summary>A status line every <see cref="BatchOptions.PlainInterval"/> plus one line per error: for logs and schedulers.</summary>
    Plain,

    /// <summary>One status line redrawn in place (carriage return) plus one line per error: for a person at a terminal.</summary>
    Terminal,
}
