namespace HandLine.Training;

/// <summary>Settings of one training run; every limit in one place.</summary>
public sealed record TrainingOptions
{
    public int Epochs { get; init; } = 30;

    /// <summary>Stop (after validating and saving) once this much training time has passed; 0 = no limit.</summary>
    public double MaxMinutes { get; init; }

    public int BatchSize { get; init; } = 16;
    public int Seed { get; init; } = 1;

    /// <summary>libtorch threads; 0 keeps its default.</summary>
    public int Threads { get; init; }

    /// <summary>Adam step size (Kingma &amp; Ba 2015 default is 1e-3).</summary>
    public double LearningRate { get; init; } = 1e-3;

    /// <summary>Gradient norm clip; LSTMs trained with CTC are prone to exploding gradients (common practice, no source).</summary>
    public double ClipNorm { get; init; } = 5;

    /// <summary>Halve the step size after this many epochs without a better validation CER or loss.</summary>
    public int PlateauEpochs { get; init; } = 2;

    /// <summary>Stop after this many epochs without a better validation CER or loss.</summary>
    public int Patience { get; init; } = 6;

    /// <summary>Continue from the checkpoint beside the output model, if there is one.</summary>
    public bool Resume { get; init; }

    /// <summary>How often a checkpoint is written during an epoch.</summary>
    public double CheckpointMinutes { get; init; } = 3;

    /// <summary>Stop after this many batches in total (tests and interruption drills); 0 = no limit.</summary>
    public long MaxBatches { get; init; }

    /// <summary>Lines per epoch (validation, schedule and saves happen at epoch ends); 0 = one pass over the set.</summary>
    public long EpochLines { get; init; }

    /// <summary>Distort training lines afresh each time they are seen; null = train on the stored lines as they are.</summary>
    public Augmentation? Augmentation { get; init; }

    public void Validate()
    {
        Augmentation?.Validate();
        if (Epochs < 1) throw new ArgumentException("epochs must be at least 1");
        if (BatchSize is < 1 or > 1024) throw new ArgumentException("batch size must be 1..1024");
        if (LearningRate is <= 0 or > 1) throw new ArgumentException("learning rate must be in (0, 1]");
        if (MaxMinutes < 0) throw new ArgumentException("max minutes must not be negative");
        if (EpochLines < 0) throw new ArgumentException("epoch lines must not be negative");
        if (Threads < 0) throw new ArgumentException("threads must not be negative");
    }
}
