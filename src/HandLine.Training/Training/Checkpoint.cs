using System.Text;
using System.Text.Json;
using System.Text.Json.Serialization;
using HandLine.Model;
using TorchSharp.Modules;

namespace HandLine.Training;

/// <summary>
/// Where a run stands, so an interrupted run can continue exactly where it stopped. <see cref="BestCer"/> and
/// <see cref="BestLoss"/> are the best epoch-end validation CER and CTC loss, which drive the schedule;
/// <see cref="EpochsSinceBest"/> counts epochs that improved neither. <see cref="SavedCer"/> is the CER of the
/// model file at the output path, which may also come from a validation made when a run stopped mid-epoch
/// (null: none yet).
/// </summary>
public sealed record TrainingState(
    [property: JsonPropertyName("epoch")] int Epoch,
    [property: JsonPropertyName("batch")] int Batch,
    [property: JsonPropertyName("lines_seen")] long LinesSeen,
    [property: JsonPropertyName("batches_done")] long BatchesDone,
    [property: JsonPropertyName("minutes")] double Minutes,
    [property: JsonPropertyName("learning_rate")] double LearningRate,
    [property: JsonPropertyName("best_cer")] double BestCer,
    [property: JsonPropertyName("epochs_since_best")] int EpochsSinceBest,
    [property: JsonPropertyName("epoch_loss_sum")] double EpochLossSum,
    [property: JsonPropertyName("saved_cer")] double? SavedCer,
    [property: JsonPropertyName("best_loss")] double? BestLoss = null)
{
    /// <summary>CER of the saved model; checkpoints from before this field saved only at epoch ends.</summary>
    [JsonIgnore]
    public double SavedOrBestCer => SavedCer ?? BestCer;
}

/// <summary>
/// A checkpoint file: magic, JSON state, network weights, optimiser state. Written atomically, so a run killed
/// while saving keeps the previous checkpoint.
/// </summary>
internal static class Checkpoint
{
    // HLCHECK1 files held TorchSharp's own optimiser state; since HandLine has its own Adam they cannot resume.
    private static readonly byte[] Magic = "HLCHECK2"u8.ToArray();
    private static readonly byte[] FirstMagic = "HLCHECK1"u8.ToArray();

    // The best CER starts as +Infinity, which plain JSON numbers cannot carry.
    private static readonly JsonSerializerOptions Json = new() { NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals };

    public static string PathFor(string modelPath) => modelPath + ".checkpoint";

    public static void Save(string path, TrainingState state, LineNetwork network, AdamOptimiser optimizer)
    {
        using var ms = new MemoryStream();
        using (var w = new BinaryWriter(ms, Encoding.UTF8, leaveOpen: true))
        {
            w.Write(Magic);
            w.Write(JsonSerializer.Serialize(state, Json));
            network.save(w);
            optimizer.Save(w);
        }
        AtomicFile.WriteAllBytes(path, ms.ToArray());
    }

    public static TrainingState Load(string path, LineNetwork network, AdamOptimiser optimizer)
    {
        try
        {
            using var r = new BinaryReader(File.OpenRead(path), Encoding.UTF8);
            var magic = r.ReadBytes(Magic.Length);
            if (magic.AsSpan().SequenceEqual(FirstMagic))
                throw new InputException(path, "checkpoint", "this checkpoint was written by an older HandLine whose optimiser state cannot be read; delete it to start afresh (or continue from the saved model with --from)");
            if (!magic.AsSpan().SequenceEqual(Magic))
                throw new InputException(path, "checkpoint", "not a HandLine training checkpoint");
            var state = JsonSerializer.Deserialize<TrainingState>(r.ReadString(), Json)
                        ?? throw new InputException(path, "checkpoint", "checkpoint state is empty");
            network.load(r, strict: true);
            optimizer.Load(r);
            return state;
        }
        catch (Exception e) when (e is IOException or JsonException or ArgumentException or InvalidOperationException)
        {
            throw new InputException(path, "checkpoint", $"cannot resume from this checkpoint: {e.Message}", e);
        }
    }
}
