using System.Security.Cryptography;
using System.Text;
using HandLine.Features;
using HandLine.Formats;
using HandLine.Model;
using HandLine.Training;

namespace HandLine.Tests.Formats;

public sealed class ContainerFileTests : IDisposable
{
    private static readonly ContainerKind Kind = new("HLTEST01", "test", "test file", "not a test file");

    private readonly string _dir = Directory.CreateTempSubdirectory("hl-container-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [Fact]
    public void The_layout_is_magic_header_length_header_payload_and_a_checksum_of_all_before()
    {
        // The layout model and language-model files have had since they were first written: spelt out here byte by
        // byte, so a change to ContainerFile that would stop old files loading fails.
        var path = Path.Combine(_dir, "f.bin");
        var header = "{\"a\":1}"u8.ToArray();
        var hash = ContainerFile.Write(path, Kind, header, w => w.Write(0x0102030405060708L));

        var expected = new List<byte>();
        expected.AddRange("HLTEST01"u8.ToArray());
        expected.AddRange(BitConverter.GetBytes(header.Length)); // little-endian, as BinaryWriter writes
        expected.AddRange(header);
        expected.AddRange(BitConverter.GetBytes(0x0102030405060708L));
        var body = expected.ToArray();
        expected.AddRange(SHA256.HashData(body));
        Assert.Equal(expected.ToArray(), File.ReadAllBytes(path));
        Assert.Equal(SHA256.HashData(body), hash);

        var (readHeader, value) = ContainerFile.Read(path, Kind, c => (Encoding.UTF8.GetString(c.Header), c.Payload.ReadInt64()));
        Assert.Equal(("{\"a\":1}", 0x0102030405060708L), (readHeader, value));
        Assert.Empty(Directory.GetFiles(_dir, "*.tmp"));
    }

    [Theory]
    [InlineData(0)]
    [InlineData(9)]
    [InlineData(14)]
    [InlineData(30)]
    [InlineData(-1)]
    public void Damage_anywhere_is_reported_as_damage_when_streamed_and_when_read_whole(int at)
    {
        var path = Path.Combine(_dir, "f.bin");
        ContainerFile.Write(path, Kind, "{\"a\":1}"u8, w => { w.Write(7); w.Write(new byte[16]); });
        var bytes = File.ReadAllBytes(path);
        bytes[at < 0 ? bytes.Length + at : at] ^= 0x20;
        File.WriteAllBytes(path, bytes);

        int Parse(ContainerContents c)
        {
            var n = c.Payload.ReadInt32();
            c.Payload.ReadBytes(16);
            return n;
        }
        var streamed = Assert.Throws<InputException>(() => ContainerFile.Read(path, Kind, Parse));
        var whole = Assert.Throws<InputException>(() => ContainerFile.Read(bytes, path, Kind, Parse));
        foreach (var e in new[] { streamed, whole })
        {
            Assert.Equal((path, "test"), (e.Path, e.Stage));
            Assert.Contains(at == 0 ? "not a test file" : "checksum mismatch", e.Reason);
        }
    }

    [Fact]
    public void A_payload_not_read_to_its_end_and_a_short_file_are_refused()
    {
        var path = Path.Combine(_dir, "f.bin");
        ContainerFile.Write(path, Kind, "{}"u8, w => w.Write(new byte[10]));
        var e = Assert.Throws<InputException>(() => ContainerFile.Read(path, Kind, c => c.Payload.ReadInt32()));
        Assert.Contains("trailing bytes", e.Reason);

        File.WriteAllBytes(path, File.ReadAllBytes(path)[..20]);
        Assert.Throws<InputException>(() => ContainerFile.Read(path, Kind, c => c.Payload.ReadBytes(10)));
    }

    [Theory]
    [InlineData("default.hlm", "91a852143421")]
    [InlineData("small.hlm", null)]
    public void The_bundled_models_load_and_written_again_give_the_same_bytes(string file, string? id)
    {
        // Their files were written before models became containers: loading them and writing them out again through
        // ContainerFile must give the very same file, so the id (the checksum) is unchanged too.
        var original = Path.Combine(TestPaths.RepoRoot, "models", file);
        using var model = ModelFile.Load(original);
        if (id is not null) Assert.Equal(id, model.Id);
        var copy = Path.Combine(_dir, file);
        Assert.Equal(model.Id, ModelFile.Save(copy, model.Header, model.Network));
        Assert.Equal(File.ReadAllBytes(original), File.ReadAllBytes(copy));
    }

    [Fact]
    public void A_checkpoint_round_trips_is_checksummed_and_the_earlier_layout_still_loads()
    {
        using var model = LineModel.Create(CharacterSet.FromString("ab"), new FeatureConfig(LineHeight: 8, FrameStride: 1), new NetworkConfig(4, 1, 0), 1);
        using var adam = new AdamOptimiser(model.Network.parameters(), 0.01);
        var state = new TrainingState(2, 5, 40, 9, 1.5, 0.01, double.PositiveInfinity, 0, 3.25, null, 0.7);

        var path = Path.Combine(_dir, "m.hlm.checkpoint");
        Checkpoint.Save(path, state, model.Network, adam);
        Assert.Equal("HLCHECK3"u8.ToArray(), File.ReadAllBytes(path)[..8]);
        Assert.Equal(state, Checkpoint.Load(path, model.Network, adam));

        var bytes = File.ReadAllBytes(path);
        bytes[bytes.Length / 2] ^= 0x20;
        File.WriteAllBytes(path, bytes);
        var e = Assert.Throws<InputException>(() => Checkpoint.Load(path, model.Network, adam));
        Assert.Contains("checksum mismatch", e.Reason);

        // HLCHECK2, as the previous build wrote it: magic, length-prefixed JSON state, weights, optimiser state.
        var json = System.Text.Json.JsonSerializer.Serialize(state, new System.Text.Json.JsonSerializerOptions
        {
            NumberHandling = System.Text.Json.Serialization.JsonNumberHandling.AllowNamedFloatingPointLiterals,
        });
        using (var w = new BinaryWriter(File.Create(path), Encoding.UTF8))
        {
            w.Write("HLCHECK2"u8);
            w.Write(json);
            model.Network.save(w);
            adam.Save(w);
        }
        Assert.Equal(state, Checkpoint.Load(path, model.Network, adam));
    }
}
