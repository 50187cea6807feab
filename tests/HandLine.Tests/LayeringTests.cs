using HandLine.Model;

namespace HandLine.Tests;

public sealed class LayeringTests
{
    [Fact]
    public void TheRuntimeLibraryDoesNotDependOnFontRenderingOrTraining()
    {
        // transcribe loads HandLine.Core only; synthesis (SkiaSharp) and the trainer live in HandLine.Training.
        var references = typeof(LineModel).Assembly.GetReferencedAssemblies().Select(a => a.Name).ToArray();
        Assert.DoesNotContain("SkiaSharp", references);
        Assert.DoesNotContain("HandLine.Training", references);
        Assert.DoesNotContain(typeof(LineModel).Assembly.GetTypes(), t => t.Namespace is "HandLine.Synthesis" or "HandLine.Training");
    }
}
