namespace HandLine.Layout;

/// <summary>
/// The upright page's ink after rule removal (1 = ink, row-major), the rules found, and how many pixels were taken
/// off as rule. <see cref="Removed"/> marks them, so the crops can whiten them too.
/// </summary>
internal sealed record RuleRemoval(int Width, int Height, byte[] Ink, byte[] Removed, IReadOnlyList<Rule> Horizontal,
    IReadOnlyList<Rule> Vertical, int RemovedPixels);
