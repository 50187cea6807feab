namespace HandLine.Review;

/// <summary>
/// The image of one run line: its own file when the source holds one line, else the line cut from the page again.
/// <see cref="WholePage"/> is true when a page's lines could not be found again and the whole page stands in.
/// </summary>
/// <param name="Extension">Lower-case file extension with its dot (".png" for a cut line).</param>
public sealed record LineImage(byte[] Bytes, string Extension, bool WholePage);
