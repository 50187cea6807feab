using System.Globalization;
using HandLine.Training;

namespace HandLine.Adaptation;

/// <summary>
/// Settings of one adaptation (<see cref="Adapter"/>): how the corrected lines are split, how long and how hard the
/// model trains on them, and which general lines are replayed beside them. The step size was chosen by measurement
/// on a validation font the bundled model never trained on (docs/adapt.md, "Choosing the settings": 0.001 took the
/// rest of that hand from 20.96 % to 9.71 % CER, 0.0003 to 11.82 %); the other values are rules of thumb, said so
/// where they are set.
/// </summary>
public sealed record AdaptOptions
{
    /// <summary>The folder the run's sources are relative to (the <c>--images</c> of <c>review</c> and <c>correct</c>).</summary>
    public required string ImagesRoot { get; init; }

    /// <summary>Fonts (files or folders) to render general lines from, or manifest TSVs to draw them from.</summary>
    public required IReadOnlyList<string> Replay { get; init; }

    /// <summary>General lines replayed per corrected training line, so the model keeps reading other hands (one for one:
    /// common practice, no source).</summary>
    public double ReplayShare { get; init; } = 1.0;

    /// <summary>Share of the corrected lines held back to stop training early and to check the result (a fifth: common
    /// practice, no source).</summary>
    public double HoldBackShare { get; init; } = 0.2;

    /// <summary>
    /// At least this many lines are held back (when there are twice as many): fewer make the before/after check a
    /// coin toss (common practice, no source).
    /// </summary>
    public int MinHeldBack { get; init; } = 5;

    /// <summary>Fewest corrected, usable lines an adaptation starts from.</summary>
    public int MinLines { get; init; } = 4;

    /// <summary>
    /// Passes over the corrected and replayed lines, at most (training stops early on the held-back lines). Measured
    /// runs still improved at pass 10; more passes cost time an editor waits for.
    /// </summary>
    public int Passes { get; init; } = 10;

    /// <summary>Adam step size; fine-tuning takes smaller steps than training from scratch.</summary>
    public double LearningRate { get; init; } = 1e-3;

    public int BatchSize { get; init; } = 8;

    /// <summary>Stop after this many passes without a better held-back CER or loss.</summary>
    public int Patience { get; init; } = 3;

    /// <summary>Distort each training line afresh each pass (null: as stored).</summary>
    public Augmentation? Augmentation { get; init; } = new();

    /// <summary>Seed of the split, the replayed lines and training.</summary>
    public int Seed { get; init; } = 1;

    /// <summary>CPU threads for the network (0 = libtorch's default).</summary>
    public int Threads { get; init; }

    /// <exception cref="ArgumentException">A setting out of range.</exception>
    public void Validate()
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(ImagesRoot);
        ArgumentNullException.ThrowIfNull(Replay);
        if (!(ReplayShare >= 0 && ReplayShare <= 10)) throw new ArgumentException($"the replay share must be between 0 and 10, not {ReplayShare}");
        if (ReplayShare > 0 && Replay.Count == 0) throw new ArgumentException("replayed lines need fonts or a manifest to come from (--replay)");
        if (!(HoldBackShare > 0 && HoldBackShare < 1)) throw new ArgumentException($"the held-back share must be above 0 and below 1, not {HoldBackShare}");
        if (MinHeldBack < 1) throw new ArgumentException("at least one line must be held back");
        if (MinLines < 2) throw new ArgumentException("an adaptation needs at least two lines (one to train on, one to check)");
        if (Passes < 1) throw new ArgumentException($"passes must be at least 1, not {Passes}");
        if (Patience < 1) throw new ArgumentException($"patience must be at least 1, not {Patience}");
        Training(0).Validate();
    }

    /// <summary>The trainer's settings for this adaptation.</summary>
    internal TrainingOptions Training(int seed) => new()
    {
        Epochs = Passes,
        BatchSize = BatchSize,
        LearningRate = LearningRate,
        Seed = seed,
        Threads = Threads,
        Patience = Patience,
        Augmentation = Augmentation,
        // A checkpoint a few seconds into a minute-long run would only cost time; adapt is rerun, not resumed.
        CheckpointMinutes = 60,
    };

    /// <summary>The settings as the model's card records them.</summary>
    public string Describe() => string.Create(CultureInfo.InvariantCulture,
        $"passes {Passes}, step size {LearningRate:G3}, batch {BatchSize}, patience {Patience}, augmentation {(Augmentation is null ? "off" : "on")}, held back {HoldBackShare:G3} (at least {MinHeldBack}), replay {ReplayShare:G3} per line, seed {Seed}");
}
