using HandLine.Formats;
using HandLine.Imaging;

namespace HandLine.Layout;

/// <summary>
/// One line found on a page, in reading order: its box in the page's pixels, the column it stands in (0 = the
/// space left of the first column divider), the entry (ruled row) it belongs to, counted from 0 down the page,
/// and its crop for the recogniser (upright, rules and other lines' ink whitened).
/// </summary>
public sealed record PageLine(LineBox Box, int Column, int Entry, GrayImage Image);
