namespace HandLine.Batch;

/// <summary>
/// What a batch did. <see cref="Sources"/> counts the sources of this run's share (all of them, even those a
/// cancelled run never reached); <see cref="Done"/> those read to completion, of which <see cref="Reused"/> came
/// from the journal of an earlier, interrupted run; <see cref="Errors"/> includes input errors found while
/// listing the inputs.
/// </summary>
public sealed record BatchCounts(int Sources, int Done, int Reused, int Lines, int Flagged, int Errors, bool Cancelled);
