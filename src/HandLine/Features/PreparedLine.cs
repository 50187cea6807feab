using HandLine.Imaging;

namespace HandLine.Features;

/// <summary>One text line made ready for the network: its normalised ink and the features taken from it.</summary>
public sealed record PreparedLine(NormalisedLine Line, FeatureSequence Features);
