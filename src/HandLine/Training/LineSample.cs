using HandLine.Features;

namespace HandLine.Training;

/// <summary>A prepared training or validation line: its features, its transcript and the transcript's classes.</summary>
public sealed record LineSample(string Id, string Text, FeatureSequence Features, int[] Target);
