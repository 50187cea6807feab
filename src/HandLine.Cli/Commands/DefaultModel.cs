namespace HandLine.Cli.Commands;

/// <summary>The bundled model, copied beside the executable at build time from the repository's models/ folder.</summary>
internal static class DefaultModel
{
    public const string FileName = "default.hlm";

    public static string PathBesideExecutable => Path.Combine(AppContext.BaseDirectory, "models", FileName);
}
