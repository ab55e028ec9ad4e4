namespace VoxProf.Reports.Model;

/// <summary>
/// Links from a Markdown report to the files beside it: relative to the report by default, or under an absolute
/// base URL (--link-base) so they still lead somewhere once the text is pasted into a pull request.
/// </summary>
public static class ReportLinks
{
    /// <summary>The link target of <paramref name="file"/> (a plain file name), percent-encoded.</summary>
    public static string Href(Uri? linkBase, string file)
    {
        string escaped = Uri.EscapeDataString(file);
        if (linkBase is null)
            return escaped;
        string root = linkBase.AbsoluteUri;
        return root.EndsWith('/') ? root + escaped : root + "/" + escaped;
    }

    /// <summary>True for an absolute http or https URL: the only links a pull request page follows to another host.</summary>
    public static bool IsValidBase(string text, out Uri? uri) =>
        Uri.TryCreate(text.Trim(), UriKind.Absolute, out uri) && uri.Scheme is "http" or "https" && uri.Query.Length == 0 && uri.Fragment.Length == 0;
}
