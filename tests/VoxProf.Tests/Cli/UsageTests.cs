using System.CommandLine;
using VoxProf.Cli;

namespace VoxProf.Tests.Cli;

public class UsageTests
{
    [Fact]
    public void No_arguments_print_the_usage_on_stderr_and_exit_2()
    {
        var output = new StringWriter();
        var error = new StringWriter();

        VoxProf.Cli.Cli.Run([], output, error).Should().Be(ExitCodes.BadInput);

        output.ToString().Should().BeEmpty();
        error.ToString().Should().Contain("Usage:").And.Contain("trace <scene>").And.Contain("compare <base> <candidate>").And.Contain("inspect")
            .And.Contain("calibrate <times> <reports>");
    }

    [Fact]
    public void An_option_has_the_same_short_name_in_every_command_and_none_takes_the_help_letter()
    {
        var root = VoxProf.Cli.Cli.BuildRoot(TextWriter.Null, TextWriter.Null);
        var shortOf = new Dictionary<string, string>();
        var longOf = new Dictionary<string, string>();
        foreach (Command command in root.Subcommands)
        {
            foreach (Option option in command.Options.Where(o => o.Name.StartsWith("--", StringComparison.Ordinal) && o.Name != "--help"))
            {
                foreach (string alias in option.Aliases.Where(a => a.Length == 2))
                {
                    alias.Should().NotBe("-h", $"{command.Name} {option.Name}: -h is help");
                    if (shortOf.TryGetValue(option.Name, out string? other))
                        alias.Should().Be(other, $"{option.Name} is {other} elsewhere");
                    if (longOf.TryGetValue(alias, out string? owner))
                        option.Name.Should().Be(owner, $"{alias} means {owner} elsewhere");
                    shortOf[option.Name] = alias;
                    longOf[alias] = option.Name;
                }
            }
        }
        shortOf.Should().Contain(new Dictionary<string, string> { ["--out"] = "-o", ["--quiet"] = "-q", ["--strategy"] = "-s" });
    }

    [Theory]
    [InlineData("trace", new[] { "--no-html", "--no-pixels", "--link-base", "--baseline", "--calibration", "-o", "-s", "-q", "-c", "-b" })]
    [InlineData("compare", new[] { "--no-html", "--link-base", "--fail-on", "-o", "-q" })]
    [InlineData("calibrate", new[] { "--device", "--features", "-o" })]
    public void Every_option_appears_in_the_help(string command, string[] options)
    {
        var output = new StringWriter();
        VoxProf.Cli.Cli.Run([command, "--help"], output, new StringWriter()).Should().Be(ExitCodes.Ok);
        foreach (string option in options)
            output.ToString().Should().Contain(option);
    }
}
