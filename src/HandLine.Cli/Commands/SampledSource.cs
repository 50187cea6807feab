using HandLine.Batch;
using HandLine.Model;

namespace HandLine.Cli.Commands;

/// <summary>One source and the posteriors of its lines.</summary>
internal sealed record SampledSource(SourceImage Source, IReadOnlyList<Posteriors> Lines);
