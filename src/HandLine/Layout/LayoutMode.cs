namespace HandLine.Layout;

/// <summary>How an image is taken: as lines (one line, or a strip of a few), as a whole page, or decided from the image.</summary>
public enum LayoutMode
{
    /// <summary>Decide from the image (<see cref="PageAnalyser.LooksLikePage"/>).</summary>
    Auto,

    /// <summary>A whole page: deskew, flatten, remove rules, find columns, lines and reading order.</summary>
    Page,

    /// <summary>A line image (or a strip of a few lines on plain paper): the line finder.</summary>
    Line,
}
