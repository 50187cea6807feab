using System.Text;
using HandLine.Batch;
using HandLine.Batch.Journal;
using HandLine.Formats;
using HandLine.Imaging;
using HandLine.Recognition;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace HandLine.Tests.Batch;

/// <summary>
/// Seeded random and mutated inputs, a bounded number of cases each: the loaders either accept the input or
/// refuse it with an <see cref="InputException"/> that names the file and says why — never another exception,
/// never a hang. Same seed, same cases, so a failure can be replayed from its case number.
/// </summary>
public sealed class FuzzTests : IDisposable
{
    private static readonly TimeSpan CaseLimit = TimeSpan.FromSeconds(10);
    private static readonly string[] ImageStages = ["decode", "limits"];
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-fuzz-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [Fact]
    public void ImageLoaderRefusesRandomAndMutatedFilesCleanly()
    {
        var rng = new Random(20_240_611);
        var originals = new[] { "png", "jpeg", "gif", "bmp", "tiff" }.Select(Encode).ToArray();
        // Small limits keep a mutated header that claims a large image from costing time.
        var options = new InputLimits { MaxPixels = 400_000, MaxFileBytes = 1 << 20 };
        int accepted = 0, refused = 0;
        for (var i = 0; i < 300; i++)
        {
            var bytes = i < 40 ? RandomFile(rng, originals) : Mutate(rng, originals[i % originals.Length]);
            var name = $"case-{i}.img";
            var outcome = WithinLimit(() => ImageLoader.Load(bytes, name, options), i);
            if (outcome is null) { accepted++; continue; }
            refused++;
            Assert.True(outcome is InputException, $"case {i}: {outcome}");
            var e = (InputException)outcome;
            Assert.Equal(name, e.Path);
            Assert.Contains(e.Stage, ImageStages);
            Assert.False(string.IsNullOrWhiteSpace(e.Reason), $"case {i}");
        }
        // Both outcomes must occur, or the mutations are not reaching the decoders' edge.
        Assert.InRange(refused, 150, 300);
        Assert.InRange(accepted, 1, 150);
    }

    [Fact]
    public void ManifestReaderReportsEveryBadLineAndNeverThrows()
    {
        var rng = new Random(1851);
        var valid = Encoding.UTF8.GetBytes("# Merrowby Hall\nledger-01.png\tRecd of Josiah Pelling £1 4s 6d\nvol2/ledger-02.png\tPd Thos. Marrable 7/6\r\n\nregister-01.png\t\n");
        var pieces = new[]
        {
            "folio.png", "../up.png", "/abs/folio.png", "C:\\scan.png", "a/./b/../c.png", "dir/", "\t", "\t\t", "\r", "#", " ",
            "\uFEFF", "£½", "x\u0001y.png", "..", ".", "\\\\server\\share.png", "Hannah d. of Wm. & Ann Cressley",
        };
        var folder = Path.Combine(_dir, "m");
        Directory.CreateDirectory(folder);
        for (var i = 0; i < 300; i++)
        {
            byte[] bytes;
            if (i % 3 == 0)
            {
                bytes = Mutate(rng, valid);
            }
            else
            {
                var text = new StringBuilder();
                var lines = rng.Next(1, 8);
                for (var l = 0; l < lines; l++)
                {
                    for (var p = rng.Next(0, 4); p > 0; p--) text.Append(pieces[rng.Next(pieces.Length)]);
                    text.Append('\n');
                }
                bytes = Encoding.UTF8.GetBytes(text.ToString());
                if (i % 3 == 2 && bytes.Length > 0) bytes[rng.Next(bytes.Length)] = (byte)rng.Next(0x80, 0x100); // break the UTF-8
            }
            var tsv = Path.Combine(folder, $"case-{i}.tsv");
            File.WriteAllBytes(tsv, bytes);

            ManifestReadResult? result = null;
            var outcome = WithinLimit(() => result = Manifest.Read(tsv), i);
            Assert.True(outcome is null, $"case {i}: {outcome}");
            foreach (var e in result!.Errors)
            {
                Assert.Equal(tsv, e.Path);
                Assert.Equal("manifest", e.Stage);
                Assert.Matches("^line [0-9]+: .+", e.Reason);
            }
            foreach (var entry in result.Entries)
            {
                Assert.DoesNotContain("..", entry.RelativePath.Split('/'));
                Assert.False(Path.IsPathRooted(entry.RelativePath), $"case {i}: {entry.RelativePath}");
                Assert.StartsWith(folder + Path.DirectorySeparatorChar, entry.FullPath);
            }
            // Listing the manifest as batch input also never throws.
            Assert.Null(WithinLimit(() => InputSet.Expand([tsv]), i));
        }
    }

    [Fact]
    public void JournalReaderSkipsDamagedRecordsAndNeverThrows()
    {
        var rng = new Random(1852);
        var record = JournalCodec.Encode(new JournalRecord
        {
            Kind = JournalRecord.Done, Order = 3, Source = "vol1/folio-3.png", ImageSha256 = new string('a', 64), ModelId = "m", OptionsHash = "o",
            Lines = [new LineResult("vol1/folio-3.png", 0, "Sold 2 cwt. hay", 0.71, true, [new("S", 0.9, 0, 1)], 0.4, -1.2)],
        });
        Assert.NotNull(JournalCodec.TryDecode(record.AsSpan(0, record.Length - 1)));
        var decoded = 0;
        for (var i = 0; i < 300; i++)
        {
            var bytes = Mutate(rng, record);
            var outcome = WithinLimit(() =>
            {
                var line = bytes.AsSpan();
                var lf = line.IndexOf((byte)'\n');
                if (JournalCodec.TryDecode(lf >= 0 ? line[..lf] : line) is not null) decoded++;
                using var stream = new MemoryStream(bytes);
                var scanner = new JournalScanner(stream, 4096);
                foreach (var entry in scanner.Entries()) Assert.True(entry.Record.IsWellFormed);
                Assert.InRange(scanner.ValidEnd, 0, bytes.Length);
            }, i);
            Assert.True(outcome is null, $"case {i}: {outcome}");
        }
        // A mutation that keeps the check intact must be rare: the check is what catches damage.
        Assert.InRange(decoded, 0, 30);
    }

    /// <summary>Runs one case on its own thread; null on success, else what it threw. A case over the limit fails the test.</summary>
    private static Exception? WithinLimit(Action action, int caseNumber)
    {
        Exception? thrown = null;
        var worker = new Thread(() =>
        {
            try { action(); }
            catch (Exception e) { thrown = e; }
        })
        { IsBackground = true };
        worker.Start();
        Assert.True(worker.Join(CaseLimit), $"case {caseNumber} took longer than {CaseLimit.TotalSeconds} s");
        return thrown;
    }

    private static byte[] Encode(string format)
    {
        using var image = new Image<Rgba32>(48, 16, new Rgba32(255, 255, 255, 255));
        for (var x = 4; x < 44; x++) image[x, 8 + (x % 5) - 2] = new Rgba32(20, 20, 20, 255);
        using var stream = new MemoryStream();
        switch (format)
        {
            case "png": image.SaveAsPng(stream); break;
            case "jpeg": image.SaveAsJpeg(stream); break;
            case "gif": image.SaveAsGif(stream); break;
            case "bmp": image.SaveAsBmp(stream); break;
            default: image.SaveAsTiff(stream); break;
        }
        return stream.ToArray();
    }

    /// <summary>Random bytes, sometimes behind a real format's first bytes so the decoders get past their signature check.</summary>
    private static byte[] RandomFile(Random rng, byte[][] originals)
    {
        var bytes = new byte[rng.Next(1, 2048)];
        rng.NextBytes(bytes);
        if (rng.Next(2) == 0)
        {
            var head = originals[rng.Next(originals.Length)];
            Array.Copy(head, bytes, Math.Min(bytes.Length, Math.Min(head.Length, rng.Next(2, 64))));
        }
        return bytes;
    }

    /// <summary>One to four edits: bit flips, byte overwrites, cuts, insertions, repeated stretches.</summary>
    private static byte[] Mutate(Random rng, byte[] original)
    {
        var bytes = new List<byte>(original);
        for (var edits = rng.Next(1, 5); edits > 0 && bytes.Count > 1; edits--)
        {
            var at = rng.Next(bytes.Count);
            switch (rng.Next(6))
            {
                case 0: bytes[at] ^= (byte)(1 << rng.Next(8)); break;
                case 1: bytes[at] = rng.Next(2) == 0 ? (byte)0x00 : (byte)0xFF; break;
                case 2: bytes.RemoveRange(at, bytes.Count - at); break;
                case 3: bytes.InsertRange(at, Enumerable.Range(0, rng.Next(1, 16)).Select(_ => (byte)rng.Next(256))); break;
                case 4: bytes.InsertRange(at, bytes.Skip(rng.Next(bytes.Count)).Take(rng.Next(1, 64)).ToArray()); break;
                default: bytes[at] = (byte)rng.Next(256); break;
            }
        }
        return bytes.ToArray();
    }
}
