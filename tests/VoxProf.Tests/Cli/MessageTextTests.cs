using VoxProf.Core;

namespace VoxProf.Tests.Cli;

public class MessageTextTests
{
    [Theory]
    [InlineData("plain text", "plain text")]
    [InlineData("a\nb\r\tc", "a\\nb\\r\\tc")]
    [InlineData("nul\0esc\u001b[0m", "nul\\u0000esc\\u001B[0m")]
    [InlineData("sep\u2028par\u2029del\u007f", "sep\\u2028par\\u2029del\\u007F")]
    [InlineData("pair \ud83d\ude00 kept", "pair \ud83d\ude00 kept")]
    public void One_line_escapes_every_control_character_and_keeps_the_rest(string text, string expected)
    {
        MessageText.OneLine(text).Should().Be(expected);
    }

    [Fact]
    public void A_lone_surrogate_is_escaped()
    {
        // Built in code: xunit's theory data would replace a lone surrogate before the test sees it.
        MessageText.OneLine("lone " + (char)0xD800 + " high").Should().Be("lone \\uD800 high");
    }

    [Fact]
    public void A_parser_echo_of_the_rest_of_the_file_is_cut_and_the_parser_words_kept()
    {
        string echo = "tru,\n  \"extent\": [4, 4, 4], 'quoted' and more text " + new string('x', 5000);

        string cut = MessageText.CutEchoes($"'{echo}' is an invalid JSON literal. Expected the literal 'true'.");

        cut.Should().Be($"'{echo[..MessageText.MaxEcho]}…' is an invalid JSON literal. Expected the literal 'true'.");
    }

    [Fact]
    public void A_message_longer_than_the_limit_is_cut_saying_how_much_was_left_out()
    {
        string shown = MessageText.ForDisplay(new string('a', MessageText.MaxLength + 250));

        shown.Should().Be(new string('a', MessageText.MaxLength) + "… (250 more characters)");
    }
}
