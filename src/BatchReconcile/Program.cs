using System.CommandLine;

var root = new RootCommand("BatchReconcile");
var name = new Argument<string>("formula");
var mass = new Command("mass", "molar mass") { name };
mass.SetAction(pr => { Console.WriteLine(pr.GetValue(name)); return 0; });
root.Subcommands.Add(mass);
return root.Parse(args).Invoke();
