using System.CommandLine;
using System.CommandLine.Invocation;
using System.Reflection;
using HandLine.Model;

namespace HandLine.Cli.Commands;

/// <summary>
/// What <c>handline --version</c> prints: the version, the commit it was built from (build/SourceCommit.targets)
/// and the bundled default model's id, the id every run records as <c>model_id</c>, so that a run can be traced
/// to the install that made it. It loads the bundled model as a run would, so it also proves that an install's
/// model and native libraries work.
/// </summary>
internal sealed class VersionReport : SynchronousCommandLineAction
{
    /// <summary>Replaces the root command's built-in version action, which prints the version alone.</summary>
    public static void Attach(RootCommand root)
    {
        ArgumentNullException.ThrowIfNull(root);
        root.Options.OfType<VersionOption>().Single().Action = new VersionReport();
    }

    public static string Version =>
        typeof(VersionReport).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion
        ?? "unknown";

    public static string Commit =>
        typeof(VersionReport).Assembly.GetCustomAttributes<AssemblyMetadataAttribute>()
            .FirstOrDefault(a => a.Key == "SourceCommit")?.Value is { Length: > 0 } commit ? commit : "unknown";

    // As the built-in action: `handline --version` alone is complete, although the root command runs nothing.
    public override bool ClearsParseErrors => true;

    public override int Invoke(ParseResult parseResult)
    {
        ArgumentNullException.ThrowIfNull(parseResult);
        var output = parseResult.InvocationConfiguration.Output;
        output.WriteLine($"handline {Version}");
        output.WriteLine($"commit {Commit}");
        var path = DefaultModel.PathBesideExecutable;
        if (!File.Exists(path))
        {
            output.WriteLine($"model none (this build has no bundled {DefaultModel.FileName})");
            return ExitCodes.Ok;
        }
        try
        {
            using var model = ModelFile.Load(path);
            output.WriteLine($"model {model.Id} (bundled {DefaultModel.FileName})");
        }
        catch (Exception e) when (e is not OutOfMemoryException)
        {
            // A damaged install: a damaged model file, or native libraries that do not load. Say which, rather
            // than a stack trace, since this is the command a user runs to check an install.
            Console.Error.WriteLine($"error: the bundled model {path} could not be loaded: {e.Message}");
            return ExitCodes.Failed;
        }
        var folder = Path.GetDirectoryName(path)!;
        var bundled = Directory.EnumerateFiles(folder, "*.hlm").Select(Path.GetFileName).Order(StringComparer.Ordinal);
        output.WriteLine($"models {folder}: {string.Join(", ", bundled)}");
        return ExitCodes.Ok;
    }
}
