using Lightward.Cli;
using Lightward.Cli.Commands;
using Spectre.Console.Cli;

var app = new CommandApp();
app.Configure(config =>
{
    config.SetApplicationName("lightward");
    config.UseStrictParsing();
    config.SetExceptionHandler((exception, _) => ErrorReporting.Report(exception));
    config.AddCommand<VersionCommand>("version").WithDescription("Print the program version and data attributions.");
});
return app.Run(args);
