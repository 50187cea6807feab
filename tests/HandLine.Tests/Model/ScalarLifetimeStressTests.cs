using HandLine.Features;
using HandLine.Model;

namespace HandLine.Tests.Model;

/// <summary>
/// A TorchSharp <c>Scalar</c> made implicitly from a C# number (<c>tensor * 3</c>, <c>arange(n)</c>) owns a native
/// c10::Scalar that only its finaliser frees. Once its handle has been passed to libtorch nothing keeps the managed
/// object alive, so a garbage collection started by another thread during the native call can free the scalar
/// while libtorch reads it: "Unknown scalar type", or a silently wrong value. These tests run many small forward
/// passes on several threads while another thread forces collections, and require every output to be exactly
/// the one computed alone.
/// </summary>
[Collection(nameof(ScalarFinalisationCollection))]
public sealed class ScalarLifetimeStressTests
{
    private static readonly FeatureConfig Pixels = new(LineHeight: 8, FrameStride: 3);

    [Fact]
    public void ForwardPassesStayExactWhileCollectionsRunOnAnotherThread()
    {
        using var model = LineModel.Create(CharacterSet.FromString("ab"), Pixels,
            new NetworkConfig(Hidden: 4, Layers: 1, Convolution: true), seed: 3);
        var lines = Enumerable.Range(0, 4).Select(i => ModelFileTests.RandomFeatures(2 + i, Pixels.FrameDimension, i)).ToArray();
        var expected = lines.Select(l => model.Run(l).LogProbs).ToArray();

        var failures = Stress(threads: 3, passesPerThread: 1000, pass: (thread, i) =>
        {
            var k = (thread + i) % lines.Length;
            var got = model.Run(lines[k]).LogProbs;
            return got.AsSpan().SequenceEqual(expected[k]) ? null : $"line {k} read differently on pass {i}";
        });
        Assert.Empty(failures);
    }

    [Fact]
    public void TrainingStepsOnSeveralThreadsMatchTheSameStepsRunAlone()
    {
        // Each thread trains its own copy of one network on the same lines; the optimiser and the loss must come
        // out as they do when nothing else runs, collections or not. libtorch may split its sums differently when
        // its threads are busy, so weights agree to a thousandth, not to the bit; a freed Scalar is far off.
        var lines = HandLine.Tests.Training.TrainerTests.PatternLines(8, seed: 2);
        float[] Train()
        {
            using var model = LineModel.Create(CharacterSet.FromString("ab"), new FeatureConfig(LineHeight: 8, FrameStride: 1),
                new NetworkConfig(Hidden: 6, Layers: 1, Dropout: 0, Convolution: true), seed: 3);
            using var adam = new HandLine.Training.AdamOptimiser(model.Network.parameters(), 0.01);
            var options = new HandLine.Training.TrainingOptions { Seed = 5 };
            for (var step = 0; step < 10; step++)
                HandLine.Training.TrainingStep.Step(model.Network, adam, lines, HandLine.Training.TrainingStep.Features(lines, options, 0, step), options, epoch: 0, index: step);
            return model.Network.parameters().SelectMany(p => p.data<float>().ToArray()).ToArray();
        }
        var expected = Train();
        var failures = Stress(threads: 3, passesPerThread: 3, pass: (thread, i) =>
        {
            var got = Train();
            for (var k = 0; k < got.Length; k++)
                if (Math.Abs(got[k] - expected[k]) > 1e-3f) return $"weight {k} trained to {got[k]}, alone {expected[k]}";
            return null;
        });
        Assert.Empty(failures);
    }

    [Fact]
    public void NoScalarIsLeftToTheFinaliserByInferenceOrTraining()
    {
        // The race above strikes rarely, so the stress tests may pass by luck. This test checks its cause
        // directly: the runtime reports every object it finalises (the FinalizeObject event of the
        // Microsoft-Windows-DotNETRuntime event source, .NET's documented GC events), and a Scalar that reaches
        // the finaliser is one that libtorch could have been reading when it was freed.
        using var model = LineModel.Create(CharacterSet.FromString("ab"), new FeatureConfig(LineHeight: 8, FrameStride: 1),
            new NetworkConfig(Hidden: 6, Layers: 1, Dropout: 0.1, Convolution: true), seed: 3);
        var lines = HandLine.Tests.Training.TrainerTests.PatternLines(8, seed: 2);
        using var adam = new HandLine.Training.AdamOptimiser(model.Network.parameters(), 0.01);
        var options = new HandLine.Training.TrainingOptions { Seed = 5, Augmentation = new HandLine.Training.Augmentation() };

        using var finalised = new FinalisedObjects(typeof(TorchSharp.Scalar));
        for (var step = 0; step < 5; step++)
            model.Run(lines.Select(l => l.Features).ToArray());
        var afterRun = finalised.Count();
        for (var step = 0; step < 5; step++)
            HandLine.Training.TrainingStep.Step(model.Network, adam, lines, HandLine.Training.TrainingStep.Features(lines, options, 0, step), options, 0, step);
        var afterStep = finalised.Count();
        Assert.Equal((0, 0), (afterRun, afterStep));
    }

    /// <summary>
    /// Runs <paramref name="pass"/> on several threads while one more thread collects garbage and runs finalisers
    /// without pause; returns every failure (an exception or a message) seen.
    /// </summary>
    internal static IReadOnlyList<string> Stress(int threads, int passesPerThread, Func<int, int, string?> pass)
    {
        var failures = new System.Collections.Concurrent.ConcurrentQueue<string>();
        using var done = new CancellationTokenSource();
        var collector = new Thread(() =>
        {
            while (!done.IsCancellationRequested)
            {
                GC.Collect();
                GC.WaitForPendingFinalizers();
            }
        })
        { IsBackground = true };
        collector.Start();
        var workers = Enumerable.Range(0, threads).Select(t => new Thread(() =>
        {
            for (var i = 0; i < passesPerThread && failures.Count < 5; i++)
            {
                try
                {
                    if (pass(t, i) is { } message) failures.Enqueue(message);
                }
                catch (Exception e)
                {
                    failures.Enqueue($"thread {t} pass {i}: {e.GetType().Name}: {e.Message.Split('\n')[0]}");
                }
            }
        })).ToArray();
        foreach (var w in workers) w.Start();
        foreach (var w in workers) w.Join();
        done.Cancel();
        collector.Join();
        return failures.ToArray();
    }

    /// <summary>Counts the objects of one type that the runtime finalises while it is alive.</summary>
    private sealed class FinalisedObjects : System.Diagnostics.Tracing.EventListener
    {
        private const string RuntimeSource = "Microsoft-Windows-DotNETRuntime";
        private const long GcKeyword = 0x1;
        private static readonly long MarkerTypeId = typeof(Marker).TypeHandle.Value.ToInt64();
        private readonly long _typeId;
        private int _count;
        private int _markers;
        private readonly bool _counting;

        public FinalisedObjects(Type type)
        {
            _typeId = type.TypeHandle.Value.ToInt64();
            // What other tests left for the finaliser is not this test's. The runtime's events reach a listener
            // late, on another thread, so counting starts only once a marker finalised after that clean-up is seen.
            Fence();
            _counting = true;
        }

        /// <summary>Collects everything unreachable, runs its finalisers and returns the count so far.</summary>
        public int Count()
        {
            Fence();
            return Volatile.Read(ref _count);
        }

        /// <summary>Finalises everything unreachable plus a marker, and waits until the marker's event arrives.</summary>
        private void Fence()
        {
            var seen = Volatile.Read(ref _markers);
            DropMarker();
            var clock = System.Diagnostics.Stopwatch.StartNew();
            while (Volatile.Read(ref _markers) == seen)
            {
                if (clock.Elapsed > TimeSpan.FromSeconds(30)) throw new TimeoutException("the runtime reported no finalisation events");
                GC.Collect();
                GC.WaitForPendingFinalizers();
                Thread.Sleep(20);
            }
        }

        [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.NoInlining)]
        private static void DropMarker() => _ = new Marker();

        protected override void OnEventSourceCreated(System.Diagnostics.Tracing.EventSource source)
        {
            if (source.Name == RuntimeSource)
                EnableEvents(source, System.Diagnostics.Tracing.EventLevel.Verbose, (System.Diagnostics.Tracing.EventKeywords)GcKeyword);
        }

        protected override void OnEventWritten(System.Diagnostics.Tracing.EventWrittenEventArgs e)
        {
            if (e.EventName?.StartsWith("FinalizeObject", StringComparison.Ordinal) != true || e.Payload is not { Count: > 0 }) return;
            var typeId = e.Payload[0] switch { IntPtr p => p.ToInt64(), ulong u => unchecked((long)u), long l => l, _ => 0 };
            if (typeId == MarkerTypeId) Interlocked.Increment(ref _markers);
            else if (_counting && typeId == _typeId) Interlocked.Increment(ref _count);
        }

        private sealed class Marker
        {
            ~Marker()
            {
            }
        }
    }
}

/// <summary>Runs alone: the finaliser counts are process-wide, so no other test may make Scalars meanwhile.</summary>
[CollectionDefinition(nameof(ScalarFinalisationCollection), DisableParallelization = true)]
public sealed class ScalarFinalisationCollection;
