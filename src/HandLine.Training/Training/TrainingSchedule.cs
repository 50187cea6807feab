namespace HandLine.Training;

/// <summary>The step-size schedule and early stopping, decided at each epoch's end.</summary>
internal static class TrainingSchedule
{
    /// <summary>
    /// The schedule at an epoch's end. Progress is a better validation CER or a lower validation CTC loss: early
    /// on, CTC first learns to output blanks everywhere and the CER sits at 100 % for thousands of lines while
    /// the loss falls, and halving the step size or stopping then would only prolong that phase. After
    /// <see cref="TrainingOptions.PlateauEpochs"/> epochs without progress the step size halves; the caller stops
    /// after <see cref="TrainingOptions.Patience"/>.
    /// </summary>
    internal const double LossProgress = 0.005;

    internal static TrainingState AfterEpoch(TrainingState state, double cer, double validLoss, TrainingOptions options)
    {
        // A loss has to fall by 0.5 % to count, so a long tail of tiny gains cannot hold the step size forever
        // (a relative threshold as plateau schedules commonly use: common practice, no source).
        var progress = cer < state.BestCer || validLoss < (state.BestLoss ?? double.PositiveInfinity) * (1 - LossProgress);
        var sinceBest = progress ? 0 : state.EpochsSinceBest + 1;
        var lr = !progress && sinceBest % options.PlateauEpochs == 0 ? state.LearningRate / 2 : state.LearningRate;
        return state with
        {
            Epoch = state.Epoch + 1,
            Batch = 0,
            BestCer = Math.Min(cer, state.BestCer),
            BestLoss = Math.Min(validLoss, state.BestLoss ?? double.PositiveInfinity),
            EpochsSinceBest = sinceBest,
            LearningRate = lr,
        };
    }
}
