using Lightward.Scenarios.Shows;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Tests.Shows;

public class DeliveryLayoutTests
{
    [Fact]
    public void Short_shows_keep_all_frames_in_one_folder_with_six_digit_numbers()
    {
        var layout = new DeliveryLayout("/out", "first light", 1800);
        Assert.Equal(Path.Combine("/out", "frames", "first_light_000001.png"), layout.FramePath(1));
        Assert.Equal(Path.Combine("/out", "frames", "first_light_001800.png"), layout.FramePath(1800));
    }

    [Fact]
    public void Long_shows_put_at_most_ten_thousand_frames_in_each_subfolder()
    {
        var layout = new DeliveryLayout("/out", "long", 25_000);
        Assert.Equal(Path.Combine("/out", "frames", "000001-010000", "long_010000.png"), layout.FramePath(10_000));
        Assert.Equal(Path.Combine("/out", "frames", "010001-020000", "long_010001.png"), layout.FramePath(10_001));
        Assert.Equal(Path.Combine("/out", "frames", "020001-025000", "long_025000.png"), layout.FramePath(25_000));
        var perFolder = Enumerable.Range(1, 25_000).GroupBy(f => Path.GetDirectoryName(layout.FramePath(f)));
        Assert.All(perFolder, folder => Assert.True(folder.Count() <= DeliveryLayout.FramesPerFolder));
    }

    [Theory]
    [InlineData(100, 3)]
    [InlineData(7, 7)]
    [InlineData(5, 8)]
    [InlineData(10_001, 16)]
    public void Shards_cover_every_frame_exactly_once(int frames, int shards)
    {
        var covered = new List<int>();
        for (int i = 0; i < shards; i++) covered.AddRange(FrameSelection.Parse(null, $"{i}/{shards}", frames).Frames);
        Assert.Equal(Enumerable.Range(1, frames), covered);
    }

    [Fact]
    public void Shards_split_a_chosen_range()
    {
        Assert.Equal(new FrameSelection(11, 15), FrameSelection.Parse("11..20", "0/2", 100));
        Assert.Equal(new FrameSelection(16, 20), FrameSelection.Parse("11..20", "1/2", 100));
    }

    [Theory]
    [InlineData("0..5", null, "--frames")]
    [InlineData("5..3", null, "--frames")]
    [InlineData("1..101", null, "--frames")]
    [InlineData("ten", null, "--frames")]
    [InlineData(null, "4/4", "--shard")]
    [InlineData(null, "1/0", "--shard")]
    [InlineData(null, "a/b", "--shard")]
    public void Bad_ranges_and_shards_name_their_flag(string? frames, string? shard, string flag)
    {
        var error = Assert.Throws<UserInputException>(() => FrameSelection.Parse(frames, shard, 100));
        Assert.StartsWith(flag + ":", error.Message);
    }
}
