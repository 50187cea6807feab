using HandLine.Formats;

namespace HandLine.Batch;

/// <summary>
/// Expands command-line inputs into source images: image files, folders (recursive, each real folder once however
/// many links lead to it: <see cref="FolderWalk"/>; sorted ordinally by relative path so every machine sees the same
/// order) and manifest TSVs. Problems become errors; the rest still loads.
/// </summary>
public static class InputSet
{
    public static readonly IReadOnlySet<string> ImageExtensions =
        new HashSet<string>(StringComparer.OrdinalIgnoreCase) { ".png", ".jpg", ".jpeg", ".tif", ".tiff", ".bmp", ".gif" };

    public static (IReadOnlyList<SourceImage> Sources, IReadOnlyList<InputException> Errors) Expand(IEnumerable<string> inputs)
    {
        var sources = new List<SourceImage>();
        var errors = new List<InputException>();
        var seen = new HashSet<string>(StringComparer.Ordinal);
        foreach (var input in inputs)
        {
            if (Directory.Exists(input))
            {
                var root = Path.GetFullPath(input);
                var (files, walkErrors) = FolderWalk.Run(root, name => ImageExtensions.Contains(Path.GetExtension(name)));
                errors.AddRange(walkErrors);
                foreach (var rel in files.Order(StringComparer.Ordinal)) Add(new SourceImage(rel, Path.Combine(root, rel)));
            }
            else if (File.Exists(input) && Path.GetExtension(input).Equals(".tsv", StringComparison.OrdinalIgnoreCase))
            {
                try
                {
                    var manifest = Manifest.Read(input);
                    errors.AddRange(manifest.Errors);
                    foreach (var e in manifest.Entries)
                        Add(new SourceImage(e.RelativePath.Replace('\\', '/'), e.FullPath, e.Text));
                }
                catch (InputException e)
                {
                    errors.Add(e);
                }
            }
            else if (File.Exists(input))
            {
                Add(new SourceImage(Path.GetFileName(input), Path.GetFullPath(input)));
            }
            else
            {
                errors.Add(new InputException(input, "read", "no such file or folder"));
            }
        }
        return (sources, errors);

        void Add(SourceImage s)
        {
            // Two inputs with the same text-file name ("a.png" and "a.jpg" both give "a.txt") would overwrite each other.
            var output = TranscriptFile.RelativePathFor(s.Source);
            if (seen.Add(output)) sources.Add(s);
            else errors.Add(new InputException(s.FullPath, "read", $"another input already writes '{output}'"));
        }
    }
}
