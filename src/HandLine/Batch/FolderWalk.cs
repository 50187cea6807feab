namespace HandLine.Batch;

/// <summary>
/// The image files under one input folder, each real folder read once. The folders themselves are walked first,
/// then the links to folders, in name order: a link is followed only when the folder it leads to is not already
/// part of the walk (the folder itself, one inside it, or one holding it), so a link back to a parent (`loop -> ..`),
/// a second link to the same folder, or a link to a folder the walk reads anyway cannot read an image twice.
/// Each such link becomes one error instead. Links to files and links to folders outside the walk are followed.
/// </summary>
internal static class FolderWalk
{
    // As the Linux kernel's own bound on links met while resolving one path (ELOOP), recalled from memory.
    private const int MaxLinksPerPath = 40;

    /// <param name="root">The folder as the user gave it (it may itself be a link).</param>
    /// <param name="isImage">Which file names to keep.</param>
    /// <returns>Paths relative to <paramref name="root"/> with '/' separators, in no particular order, and the
    /// links and folders that were not read.</returns>
    public static (List<string> Files, List<InputException> Errors) Run(string root, Func<string, bool> isImage)
    {
        var files = new List<string>();
        var errors = new List<InputException>();
        var rootPath = Path.GetFullPath(root);
        var rootReal = RealPath(rootPath);
        if (rootReal is null)
        {
            errors.Add(new InputException(root, "read", "the folder's path holds a link loop"));
            return (files, errors);
        }

        var walked = new HashSet<string>(StringComparer.Ordinal);
        var walkRoots = new List<string>();
        var links = new Queue<(string Relative, string Real)>();
        Walk(rootReal, "");

        while (links.TryDequeue(out var link))
        {
            var linkPath = Path.Combine(rootPath, link.Relative);
            if (Overlaps(link.Real) is { } already)
            {
                errors.Add(new InputException(linkPath, "read",
                    $"link '{Path.GetFileName(link.Relative)}' to '{link.Real}' leads back into a folder already read ('{already}'), so it is not followed"));
                continue;
            }
            Walk(link.Real, link.Relative);
        }
        return (files, errors);

        // The real folder at `real`, reached as `relative`, and every real folder inside it; links are queued.
        void Walk(string real, string relative)
        {
            walkRoots.Add(real);
            var pending = new Stack<(string Real, string Relative)>();
            pending.Push((real, relative));
            while (pending.TryPop(out var folder))
            {
                if (!walked.Add(folder.Real)) continue;
                IEnumerable<FileSystemInfo> entries;
                try
                {
                    entries = new DirectoryInfo(folder.Real).EnumerateFileSystemInfos().OrderBy(e => e.Name, StringComparer.Ordinal).ToArray();
                }
                catch (Exception e) when (e is IOException or UnauthorizedAccessException)
                {
                    errors.Add(new InputException(Path.Combine(rootPath, folder.Relative), "read", $"the folder cannot be listed ({e.Message})"));
                    continue;
                }
                foreach (var entry in entries)
                {
                    var rel = folder.Relative.Length == 0 ? entry.Name : folder.Relative + "/" + entry.Name;
                    if (entry.LinkTarget is null)
                    {
                        if (entry is DirectoryInfo) pending.Push((Path.Combine(folder.Real, entry.Name), rel));
                        else if (isImage(entry.Name)) files.Add(rel);
                        continue;
                    }
                    var target = RealPath(Path.Combine(folder.Real, entry.Name));
                    if (target is not null && Directory.Exists(target))
                        links.Enqueue((rel, target));
                    else if (target is null)
                        errors.Add(new InputException(Path.Combine(rootPath, rel), "read",
                            $"link '{entry.Name}' leads into a loop of links and is not followed"));
                    // A link to a file is read like the file; a link that leads nowhere too, and reading it says so.
                    else if (isImage(entry.Name))
                        files.Add(rel);
                }
            }
        }

        // A folder already read that `real` is, lies in or holds; null when `real` is new to the walk.
        string? Overlaps(string real)
        {
            for (var up = real; up is not null; up = Path.GetDirectoryName(up))
                if (walked.Contains(up))
                    return up;
            var inside = real.EndsWith(Path.DirectorySeparatorChar) ? real : real + Path.DirectorySeparatorChar;
            return walkRoots.FirstOrDefault(r => r.StartsWith(inside, StringComparison.Ordinal));
        }
    }

    /// <summary>
    /// The path with every link in it resolved, "." and ".." taken as the file system does (after the link before
    /// them), as realpath(3) gives it; null when it meets more than <see cref="MaxLinksPerPath"/> links (a loop).
    /// A part that does not exist is kept as written.
    /// </summary>
    internal static string? RealPath(string path)
    {
        var full = Path.GetFullPath(path);
        var current = Path.GetPathRoot(full)!;
        var parts = new Stack<string>(Parts(full[current.Length..]).Reverse());
        var links = 0;
        while (parts.TryPop(out var part))
        {
            if (part == ".") continue;
            if (part == "..")
            {
                current = Path.GetDirectoryName(current) ?? current;
                continue;
            }
            var next = Path.Combine(current, part);
            string? target;
            try
            {
                target = new FileInfo(next).LinkTarget;
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                target = null;
            }
            if (target is null)
            {
                current = next;
                continue;
            }
            if (++links > MaxLinksPerPath) return null;
            if (Path.IsPathRooted(target)) current = Path.GetPathRoot(target)!;
            foreach (var p in Parts(Path.IsPathRooted(target) ? target[Path.GetPathRoot(target)!.Length..] : target).Reverse())
                parts.Push(p);
        }
        return current;
    }

    private static IEnumerable<string> Parts(string path) =>
        path.Split([Path.DirectorySeparatorChar, Path.AltDirectorySeparatorChar], StringSplitOptions.RemoveEmptyEntries);
}
