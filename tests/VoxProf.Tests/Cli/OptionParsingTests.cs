using System.Numerics;
using VoxProf.Cli;
using VoxProf.Core;
using VoxProf.Core.Strategies;
using VoxProf.Core.Traversal;

namespace VoxProf.Tests.Cli;

public class OptionParsingTests
{
    [Theory]
    [InlineData("1280x720", 1280, 720)]
    [InlineData("16384X1", 16384, 1)]
    [InlineData(" 64x48 ", 64, 48)]
    public void Sizes_in_WxH_form_parse(string text, int w, int h)
    {
        OptionParsing.Size(text).Should().Be((w, h));
    }

    [Theory]
    [InlineData("0x720")]
    [InlineData("1280x0")]
    [InlineData("16385x10")]
    [InlineData("1280")]
    [InlineData("1280x720x2")]
    [InlineData("-5x10")]
    [InlineData("axb")]
    public void Bad_sizes_are_refused_with_the_expected_form(string text)
    {
        FluentActions.Invoking(() => OptionParsing.Size(text))
            .Should().Throw<InputException>().WithMessage($"--size: '{text}' is not a valid size, expected WxH*");
    }

    [Fact]
    public void Vectors_parse_with_invariant_decimals_in_any_culture()
    {
        using var _ = new VoxProf.Tests.Reports.CultureScope("de-DE");
        OptionParsing.Vector("1.5,-2,3e1", "--eye").Should().Be(new Vector3(1.5f, -2, 30));
        FluentActions.Invoking(() => OptionParsing.Vector("1,2", "--eye")).Should().Throw<InputException>().WithMessage("--eye: *X,Y,Z*");
        FluentActions.Invoking(() => OptionParsing.Vector("1,2,nan", "--up")).Should().Throw<InputException>();
    }

    [Fact]
    public void Ranges_need_a_minimum_below_the_maximum()
    {
        OptionParsing.Range("0:250.5").Should().Be((0, 250.5));
        FluentActions.Invoking(() => OptionParsing.Range("5:5")).Should().Throw<InputException>().WithMessage("--range: *MIN:MAX*");
        FluentActions.Invoking(() => OptionParsing.Range("10")).Should().Throw<InputException>();
        FluentActions.Invoking(() => OptionParsing.Range("-1:4")).Should().Throw<InputException>();
    }

    [Fact]
    public void Lists_keep_order_drop_duplicates_and_name_every_valid_choice_on_error()
    {
        OptionParsing.List<StrategyDefinition>("dda, grid,dda", "--strategy", "strategy", new StrategyCatalog().TryParse, new StrategyCatalog().ValidList)
            .Should().Equal(BuiltInStrategies.Dda, BuiltInStrategies.Grid);
        FluentActions.Invoking(() => OptionParsing.List<StrategyDefinition>("dda,octo", "--strategy", "strategy", new StrategyCatalog().TryParse, new StrategyCatalog().ValidList))
            .Should().Throw<InputException>()
            .WithMessage("--strategy: unknown strategy 'octo'; expected one of: grid, slab, dda, dda-mask, hdda");
    }
}
