namespace VoxProf.Tests.Reports;

/// <summary>Compares output with a stored expected file; on a difference, leaves the actual text in the temp folder.</summary>
internal static class Snapshot
{
    public static void Match(string actual, string expectedFile) => Match(actual, "Reports", expectedFile);

    /// <param name="folder">Test folder whose Expected/ subfolder holds the file.</param>
    public static void Match(string actual, string folder, string expectedFile)
    {
        string path = Path.Combine(AppContext.BaseDirectory, folder, "Expected", expectedFile);
        string expected = File.Exists(path) ? File.ReadAllText(path) : "";
        if (actual != expected)
        {
            string dump = Path.Combine(Path.GetTempPath(), "voxprof-snapshots");
            Directory.CreateDirectory(dump);
            File.WriteAllText(Path.Combine(dump, expectedFile), actual);
        }
        actual.Should().Be(expected, $"output must match {folder}/Expected/{expectedFile} (actual left in the temp folder)");
    }
}

/// <summary>Runs a body under another culture, so culture-dependent formatting shows up as a snapshot difference.</summary>
internal sealed class CultureScope : IDisposable
{
    private readonly System.Globalization.CultureInfo _culture = System.Globalization.CultureInfo.CurrentCulture;
    private readonly System.Globalization.CultureInfo _uiCulture = System.Globalization.CultureInfo.CurrentUICulture;

    public CultureScope(string name)
    {
        var c = new System.Globalization.CultureInfo(name);
        System.Globalization.CultureInfo.CurrentCulture = c;
        System.Globalization.CultureInfo.CurrentUICulture = c;
    }

    public void Dispose()
    {
        System.Globalization.CultureInfo.CurrentCulture = _culture;
        System.Globalization.CultureInfo.CurrentUICulture = _uiCulture;
    }
}
