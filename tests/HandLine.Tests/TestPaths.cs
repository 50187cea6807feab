namespace HandLine.Tests;

/// <summary>Locations in the repository, found from the test binaries.</summary>
internal static class TestPaths
{
    public static string RepoRoot { get; } = FindRepoRoot();

    public static string Fixtures => Path.Combine(RepoRoot, "fixtures");

    private static string FindRepoRoot()
    {
        for (var dir = new DirectoryInfo(AppContext.BaseDirectory); dir is not null; dir = dir.Parent)
            if (File.Exists(Path.Combine(dir.FullName, "HandLine.sln")))
                return dir.FullName;
        throw new InvalidOperationException("HandLine.sln not found above " + AppContext.BaseDirectory);
    }
}
