using HandLine.Imaging;

namespace HandLine.Synthesis;

/// <summary>One rendered line with everything needed to reproduce it.</summary>
public sealed record SyntheticLine(string Text, FontFace Font, Degradation Degradation, GrayImage Image);
