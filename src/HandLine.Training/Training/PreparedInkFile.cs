using System.Security.Cryptography;
using System.Text;
using System.Text.Json;
using System.Text.Json.Serialization;
using HandLine.Features;
using HandLine.Formats;

namespace HandLine.Training;

/// <summary>
/// Normalised ink for every line of one manifest, in manifest order, as 8-bit rows, optionally kept in a file
/// beside the manifest (<c>MANIFEST.prepared</c>). Preparing 230,000 lines takes 17–27 minutes on 2 cores;
/// reading them back takes seconds, which matters when training continues over several sessions. The file is
/// reused only when its key matches: the manifest's lines, each image's size and modification time, the
/// imaging settings and the build of this library (any code change may change the ink). Anything else —
/// another key, a damaged or truncated file — means the lines are prepared afresh and the file rewritten.
/// </summary>
public static class PreparedInkFile
{
    // A ContainerFile since HLPREP1 (which had no checksum); older files are simply prepared afresh.
    private static readonly ContainerKind Kind = new("HLPREP02", "prepared lines", "prepared lines", "not a prepared-lines file");

    /// <summary>The container's header: which preparation the lines come from, and their shape.</summary>
    private sealed record Header(
        [property: JsonPropertyName("key")] string Key,
        [property: JsonPropertyName("count")] int Count,
        [property: JsonPropertyName("height")] int Height);

    /// <summary>One manifest line: its ink (row-major, 0 paper .. 255 ink) or why it could not be prepared.</summary>
    public sealed record Line(byte[]? Ink, int Width, InputException? Failure);

    /// <summary>The cache file used for a manifest.</summary>
    public static string CachePath(string manifest) => manifest + ".prepared";

    /// <summary>
    /// Prepared lines for <paramref name="entries"/> (one per entry, same order). With <paramref name="keep"/> a
    /// matching cache file is read instead of the images, and a fresh preparation is written to it
    /// (atomically; a failure to write is reported through <paramref name="note"/> and otherwise ignored).
    /// <paramref name="cancel"/> stops a preparation with an <see cref="OperationCanceledException"/>, writing nothing.
    /// </summary>
    public static IReadOnlyList<Line> Load(string manifest, IReadOnlyList<ManifestEntry> entries, LinePreparer preparer,
        int threads, bool keep, Action<string>? note = null, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(manifest);
        ArgumentNullException.ThrowIfNull(entries);
        ArgumentNullException.ThrowIfNull(preparer);
        if (!keep) return Prepare(entries, preparer, threads, cancel);

        var path = CachePath(manifest);
        var key = Key(entries, preparer);
        var height = preparer.Features.LineHeight;
        var cached = TryRead(path, key, entries.Count, height);
        if (cached is not null)
        {
            note?.Invoke($"read {entries.Count} prepared lines from {path}");
            return cached;
        }
        var lines = Prepare(entries, preparer, threads, cancel);
        try
        {
            Write(path, key, height, lines);
            note?.Invoke($"kept {lines.Length} prepared lines in {path}");
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            note?.Invoke($"could not keep prepared lines in {path}: {e.Message}");
        }
        return lines;
    }

    private static Line[] Prepare(IReadOnlyList<ManifestEntry> entries, LinePreparer preparer, int threads, CancellationToken cancel)
    {
        var lines = new Line[entries.Count];
        var parallel = new ParallelOptions
        {
            MaxDegreeOfParallelism = threads > 0 ? threads : Environment.ProcessorCount,
            CancellationToken = cancel,
        };
        Parallel.For(0, entries.Count, parallel, i =>
        {
            var e = entries[i];
            try
            {
                // Transcription's stages, stopping before the line finder: a training image is one line already.
                var line = preparer.Normalise(preparer.Load(e.FullPath), e.FullPath);
                if (!line.HasInk)
                    throw new InputException(e.FullPath, "normalise", "no ink found: the image looks blank");
                lines[i] = new Line(LineSample.ToBytes(line.Ink.Pixels), line.Ink.Width, null);
            }
            catch (InputException ex)
            {
                lines[i] = new Line(null, 0, ex);
            }
        });
        return lines;
    }

    private static string Key(IReadOnlyList<ManifestEntry> entries, LinePreparer preparer)
    {
        using var hash = IncrementalHash.CreateHash(HashAlgorithmName.SHA256);
        void Add(string s) => hash.AppendData(Encoding.UTF8.GetBytes(s + "\n"));
        // The code that prepares a line lives in the runtime library (LinePreparer) and the packing here: both
        // identities key the file. Deterministic builds, no commit id in the version: same code, same id.
        Add(typeof(LinePreparer).Assembly.ManifestModule.ModuleVersionId.ToString());
        Add(typeof(PreparedInkFile).Assembly.ManifestModule.ModuleVersionId.ToString());
        Add(JsonSerializer.Serialize(preparer.Features));
        Add(JsonSerializer.Serialize(preparer.Tuning));
        Add(JsonSerializer.Serialize(preparer.Limits));
        foreach (var e in entries)
        {
            var info = new FileInfo(e.FullPath);
            Add(info.Exists ? $"{e.FullPath}\t{info.Length}\t{info.LastWriteTimeUtc.Ticks}" : $"{e.FullPath}\tmissing");
        }
        return Convert.ToHexStringLower(hash.GetHashAndReset());
    }

    private static Line[]? TryRead(string path, string key, int count, int height)
    {
        if (!File.Exists(path)) return null;
        try
        {
            return ContainerFile.Read(path, Kind, c =>
            {
                var header = JsonSerializer.Deserialize<Header>(c.Header);
                if (header is null || header.Key != key || header.Count != count || header.Height != height) return null;
                var reader = c.Payload;
                var lines = new Line[count];
                for (var i = 0; i < count; i++)
                {
                    if (reader.ReadBoolean())
                    {
                        var width = reader.ReadInt32();
                        if (width < 1 || (long)width * height > c.PayloadLength) return null;
                        var ink = reader.ReadBytes(width * height);
                        if (ink.Length != width * height) return null;
                        lines[i] = new Line(ink, width, null);
                    }
                    else
                    {
                        var (file, stage, reason) = (reader.ReadString(), reader.ReadString(), reader.ReadString());
                        lines[i] = new Line(null, 0, new InputException(file, stage, reason));
                    }
                }
                return lines;
            });
        }
        catch (InputException)
        {
            return null; // another key, or damaged or truncated: prepare afresh
        }
        catch (IOException)
        {
            return null;
        }
    }

    private static void Write(string path, string key, int height, IReadOnlyList<Line> lines)
    {
        var header = JsonSerializer.SerializeToUtf8Bytes(new Header(key, lines.Count, height));
        ContainerFile.Write(path, Kind, header, writer =>
        {
            foreach (var l in lines)
            {
                writer.Write(l.Ink is not null);
                if (l.Ink is not null)
                {
                    writer.Write(l.Width);
                    writer.Write(l.Ink);
                }
                else
                {
                    writer.Write(l.Failure!.Path);
                    writer.Write(l.Failure.Stage);
                    writer.Write(l.Failure.Reason);
                }
            }
        });
    }
}
