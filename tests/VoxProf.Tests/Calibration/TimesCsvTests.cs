using VoxProf.Core;
using VoxProf.Core.Calibration;
using VoxProf.Reports.Calibration;
using VoxProf.Tests.Compare;

namespace VoxProf.Tests.Calibration;

public sealed class TimesCsvTests : IDisposable
{
    private readonly TempDir _tmp = new();

    public void Dispose() => _tmp.Dispose();

    private string Write(string text)
    {
        string path = Path.Combine(_tmp.Path, "times.csv");
        File.WriteAllText(path, text);
        return path;
    }

    private string ErrorOf(string text)
    {
        string path = Write(text);
        return FluentActions.Invoking(() => TimesCsv.Read(path)).Should().Throw<InputException>().Which.Message;
    }

    [Fact]
    public void Records_read_with_RFC_4180_quoting_comments_and_optional_columns()
    {
        // RFC 4180: CRLF line ends, a quoted field holding a comma, a doubled quote and a line break.
        string path = Write(
            "# measured on the lab machine, median of 20 frames\r\n" +
            "Scene,camera,strategy,prepass,branching,size,gpu-ms,note\r\n" +
            "ring-post,front,dda,off,4,48x32,1.25,\"warm, \"\"steady\"\" clocks\"\r\n" +
            "ring-post,above,hdda,4,,,0.5,\"two\r\nlines\"\r\n" +
            "ring-post, corner ,grid,,,,2e-1,\r\n");

        var rows = TimesCsv.Read(path);

        rows.Should().Equal(
            new TimeRow(3, "ring-post", "front", "dda", 0, 4, new ImageSize(48, 32), 1.25, "warm, \"steady\" clocks"),
            new TimeRow(4, "ring-post", "above", "hdda", 4, null, null, 0.5, "two\r\nlines"),
            new TimeRow(6, "ring-post", "corner", "grid", null, null, null, 0.2, null));
    }

    [Theory]
    [InlineData("scene,camera,strategy,gpu-ms\nyard,gate,dda,1,5\n", "line 2: the record has 5 fields but 4 were expected; a number with a decimal comma splits in two: write 1.5, not 1,5")]
    [InlineData("scene,camera,strategy,gpu-ms\nyard,gate,dda,2\nyard,gate,dda,\"1.5\n", "line 3: Malformed CSV: a quoted field that is never closed")]
    public void Malformed_records_name_their_line_once(string text, string message)
    {
        ErrorOf(text).Should().StartWith(Path.Combine(_tmp.Path, "times.csv: ") + message).And.NotContain("(line").And.NotContain("\n");
    }

    [Theory]
    [InlineData("scene,camera,strategy,gpu-ms\nyard,gate,dda,1\nyard,gate,hdda,\"1,5\"\n", "line 3: gpu-ms '1,5': expected a positive time in milliseconds with a '.' decimal point, e.g. 2.75")]
    [InlineData("scene,camera,strategy,gpu-ms\nyard,gate,dda,-2\n", "line 2: gpu-ms '-2': expected a positive time")]
    [InlineData("scene,camera,strategy,gpu-ms\nyard,gate,dda,\n", "line 2: gpu-ms: empty; expected the measured GPU time in milliseconds")]
    [InlineData("scene,camera,strategy,gpu-ms\nyard,,dda,1\n", "line 2: camera: empty; expected the camera's name")]
    [InlineData("scene,camera,strategy,gpu-ms,prepass\nyard,gate,dda,1,3\n", "line 2: prepass '3': expected off, 0, 2, 4 or 8")]
    [InlineData("scene,camera,strategy,gpu-ms,size\nyard,gate,dda,1,1280*720\n", "line 2: size '1280*720': expected the traced image size WxH")]
    [InlineData("scene,camera,strategy,gpu-ms,branching\n\nyard,gate,dda,1,one\n", "line 3: branching 'one': expected the tree's branching factor")]
    [InlineData("scene,camera,strategy,time\n", "header: unknown column 'time'; expected the columns scene, camera, strategy, gpu-ms, and optionally prepass, branching, size, note")]
    [InlineData("scene,camera,gpu-ms\nyard,gate,1\n", "header: missing column 'strategy'")]
    [InlineData("scene,camera,strategy,gpu-ms,Scene\n", "header: column 'scene' appears twice")]
    [InlineData("scene,camera,strategy,gpu-ms\n", "no records after the header")]
    [InlineData("", "empty; expected the columns scene")]
    public void Bad_values_and_headers_are_one_line_naming_the_file_the_line_and_the_column(string text, string message)
    {
        string error = ErrorOf(text);

        error.Should().StartWith(Path.Combine(_tmp.Path, "times.csv") + ": ").And.Contain(message).And.NotContain("\n");
    }

    [Fact]
    public void A_missing_file_is_named()
    {
        string path = Path.Combine(_tmp.Path, "nope.csv");
        FluentActions.Invoking(() => TimesCsv.Read(path)).Should().Throw<InputException>()
            .WithMessage($"{path}: not found (expected a CSV file of measured GPU times)");
    }
}
